import Dexie, { type EntityTable } from 'dexie'
import type { LocalAttachment } from './attachments'
import type { DraftRow } from './draft-schema'
import type { LocalExam, MetaRow, OutboxItem } from './sync-schema'

/** The one IndexedDB database of the app. Never edit a shipped version; add version(n + 1). */
export const db = new Dexie('plumbline') as Dexie & {
  drafts: EntityTable<DraftRow, 'id'>
  exams: EntityTable<LocalExam, 'id'>
  outbox: EntityTable<OutboxItem, 'seq'>
  meta: EntityTable<MetaRow, 'key'>
  attachments: EntityTable<LocalAttachment, 'id'>
}

db.version(1).stores({
  drafts: 'id, state, updatedAt',
})

// Offline copies of exams, the queue of changes waiting for the server (in the order saved), and per-user sync state.
db.version(2).stores({
  exams: 'id, ownerId',
  outbox: '++seq, examId, authorId',
  meta: 'key',
})

// Photos of the measurement set-up waiting to be sent once their exam is on the server (issue 7).
db.version(3).stores({
  attachments: 'id, examId, authorId, state',
})

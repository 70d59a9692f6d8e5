import type { ExamInput } from '#shared/schemas/exam'
import type { SyncItemError } from '#shared/schemas/sync'
import type { User } from '#shared/schemas/user'
import type { DraftRow } from '@/db/draft-schema'
import { outboxOf, queueSave } from '@/db/outbox'
import { storageProblem } from '@/db/storage-errors'
import { estimateBasisInUse } from './settings'

/** Where a saved exam stands once the sync that followed the save is over. */
export type QueuedSave =
  | { kind: 'saved'; examId: string }
  | { kind: 'kept-offline' }
  | { kind: 'conflict' }
  | { kind: 'refused'; error: SyncItemError | null }
  | { kind: 'not-stored'; message: string }

async function standing(examId: string, authorId: string): Promise<QueuedSave> {
  const item = (await outboxOf(authorId)).find((queued) => queued.examId === examId)
  if (!item) return { kind: 'saved', examId }
  if (item.state === 'pending') return { kind: 'kept-offline' }
  return item.state === 'conflict' ? { kind: 'conflict' } : { kind: 'refused', error: item.lastError }
}

/**
 * Stores the exam and its outbox change on this device in one transaction, then lets sync try to send it. Nothing is
 * lost when the server is out of reach: the change waits in the outbox.
 */
export async function queueAndSync(draft: DraftRow, input: ExamInput, author: User, sync: () => Promise<void>): Promise<QueuedSave> {
  try {
    await queueSave(draft, input, author, estimateBasisInUse())
  } catch (e) {
    return { kind: 'not-stored', message: storageProblem(e) }
  }
  await sync()
  return standing(input.id, author.id)
}

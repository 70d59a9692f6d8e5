import type { ExamInput } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import type { DraftRow } from './draft-schema'
import { db } from './index'
import { localExamOf, plain, type EstimateBasis } from './local-exams'
import type { OutboxItem } from './sync-schema'

const bySeq = (a: OutboxItem, b: OutboxItem) => a.seq - b.seq

/**
 * Queues a change behind the exam's earlier ones: it shares their base version until the server acknowledges them.
 * A refused change is replaced; a conflict keeps waiting for the user, now holding the newest local version.
 */
async function enqueue(items: OutboxItem[], payload: ExamInput, authorId: string, knownVersion: number | undefined) {
  const blocked = items.find((item) => item.state !== 'pending')
  if (blocked?.state === 'conflict') return void (await db.outbox.update(blocked.seq, { payload: plain(payload) }))
  if (blocked) await db.outbox.delete(blocked.seq)
  const baseVersion = blocked?.baseVersion ?? items[0]?.baseVersion ?? (knownVersion || null)
  const queuedAt = new Date().toISOString()
  const item = { examId: payload.id, authorId, payload: plain(payload), baseVersion, state: 'pending' as const }
  await db.outbox.add({ ...item, attempts: 0, lastError: null, serverCopy: null, queuedAt })
}

/**
 * Saves an exam for sending, in one transaction: its local copy (estimated with `basis`), the outbox change and the
 * draft marked saved.
 */
export async function queueSave(draft: DraftRow, payload: ExamInput, author: User, basis: EstimateBasis): Promise<void> {
  await db.transaction('rw', db.exams, db.outbox, db.drafts, async () => {
    const previous = await db.exams.get(payload.id)
    const items = (await db.outbox.where('examId').equals(payload.id).toArray()).sort(bySeq)
    await enqueue(items, payload, author.id, previous?.version)
    await db.exams.put(plain(localExamOf(payload, author, basis, previous)))
    await db.drafts.put(plain({ ...draft, state: 'saved' as const }))
  })
}

/** The author's changes in the order saved. */
export async function outboxOf(authorId: string): Promise<OutboxItem[]> {
  return (await db.outbox.where('authorId').equals(authorId).toArray()).sort(bySeq)
}

function pick(items: OutboxItem[], maxItems: number, maxBytes: number): { batch: OutboxItem[]; full: boolean } {
  const batch: OutboxItem[] = []
  const taken = new Set<string>()
  let bytes = 0
  for (const item of items) {
    const first = !taken.has(item.examId)
    taken.add(item.examId)
    if (!first || item.state !== 'pending') continue
    const size = JSON.stringify(item.payload).length
    if (batch.length && (batch.length >= maxItems || bytes + size > maxBytes)) return { batch, full: true }
    batch.push(item)
    bytes += size
  }
  return { batch, full: false }
}

/**
 * The next changes to send: the author's only, in the order saved, the first waiting change of each exam (later ones
 * are based on it), none of an exam held back by a refusal or a conflict, within a count and a size.
 */
export async function nextBatch(authorId: string, maxItems: number, maxBytes: number): Promise<OutboxItem[]> {
  // The authorId index keeps each author's changes in seq order: read a window, and a wider one only when needed.
  for (let window = maxItems * 2; ; window *= 4) {
    const items = await db.outbox.where('authorId').equals(authorId).limit(window).toArray()
    const { batch, full } = pick(items, maxItems, maxBytes)
    if (full || items.length < window) return batch
  }
}

/** Exams of the author not yet acknowledged by the server, and how many of them wait for the user. */
export async function outboxCounts(authorId: string): Promise<{ unsynced: number; attention: number }> {
  const items = await outboxOf(authorId)
  const attention = items.filter((item) => item.state !== 'pending')
  return { unsynced: new Set(items.map((item) => item.examId)).size, attention: attention.length }
}

/** Work that signing out would destroy: every queued change on the device, and unfinished exams with a patient code. */
export async function unsyncedWorkOnDevice(): Promise<{ changes: number; drafts: number; photos: number }> {
  const drafts = await db.drafts.where('state').equals('editing').filter((row) => !!row.fields?.patientCode).count()
  // A photo's row leaves the device only once the server has acknowledged it, so every row is unsent.
  return { changes: await db.outbox.count(), drafts, photos: await db.attachments.count() }
}

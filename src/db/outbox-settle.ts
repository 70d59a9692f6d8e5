import type { SyncItemError, SyncResult } from '#shared/schemas/sync'
import { db } from './index'
import { plain } from './local-exams'
import { queuedFor } from './outbox-queries'
import type { OutboxItem } from './sync-schema'

const CONFLICT: SyncItemError = { code: 'conflict', message: 'This exam changed on the server after your copy was made' }

interface Acknowledged {
  item: OutboxItem
  version: number
  later: OutboxItem[]
}

/** Acknowledged changes leave; the exams' later changes move onto the version the server gave. */
async function acknowledgeAll(acks: Acknowledged[]) {
  await db.outbox.bulkDelete(acks.map((ack) => ack.item.seq))
  await db.outbox.bulkUpdate(acks.flatMap((ack) => ack.later.map((next) => ({ key: next.seq, changes: { baseVersion: ack.version } }))))
  await db.exams.bulkUpdate(acks.map((ack) => ({ key: ack.item.examId, changes: { version: ack.version } })))
}

/** Keeps one change for the user to resolve: the newest local version against the server's. */
async function holdConflict(item: OutboxItem, result: Extract<SyncResult, { result: 'conflict' }>, later: OutboxItem[]) {
  const payload = (later.at(-1) ?? item).payload
  await db.outbox.bulkDelete(later.map((next) => next.seq))
  await db.outbox.update(item.seq, { state: 'conflict', payload, serverCopy: plain(result.exam), lastError: CONFLICT })
}

/** A refused change waits for the user, unless a later save of the same exam already replaces it. */
async function refuse(item: OutboxItem, error: SyncItemError, later: OutboxItem[]) {
  if (later.length) return db.outbox.delete(item.seq)
  await db.outbox.update(item.seq, { state: 'needs-attention', lastError: error, attempts: item.attempts + 1 })
}

function settle(item: OutboxItem, result: Exclude<SyncResult, { version: number }>, later: OutboxItem[]) {
  return result.result === 'conflict' ? holdConflict(item, result, later) : refuse(item, result.error, later)
}

/**
 * Applies the server's answers in one transaction; only an acknowledged change leaves the outbox. Answers how many
 * sent changes got no answer (they stay queued).
 */
export async function settleResults(batch: OutboxItem[], results: SyncResult[]): Promise<number> {
  const answers = new Map(results.map((result) => [result.id, result]))
  return db.transaction('rw', db.outbox, db.exams, async () => {
    const queued = await queuedFor(batch.map((item) => item.examId))
    const acks: Acknowledged[] = []
    let unanswered = 0
    for (const sent of batch) {
      const items = queued.get(sent.examId) ?? []
      const item = items.find((q) => q.seq === sent.seq)
      const answer = answers.get(sent.examId)
      if (!item) continue // removed meanwhile: signed out, or the server's copy was taken
      const later = items.filter((q) => q.seq > sent.seq)
      if (!answer) unanswered++
      if (!answer) await db.outbox.update(item.seq, { attempts: item.attempts + 1 })
      else if ('version' in answer) acks.push({ item, version: answer.version, later })
      else await settle(item, answer, later)
    }
    await acknowledgeAll(acks)
    return unanswered
  })
}

/** Notes a failed attempt on each sent change; nothing leaves the outbox. */
export async function recordFailure(batch: OutboxItem[], error: SyncItemError): Promise<void> {
  await db.transaction('rw', db.outbox, async () => {
    for (const sent of batch) {
      const item = await db.outbox.get(sent.seq)
      if (item) await db.outbox.update(item.seq, { attempts: item.attempts + 1, lastError: error })
    }
  })
}

import { db } from './index'
import type { OutboxItem } from './sync-schema'

/**
 * The exams' changes still queued, oldest first. One small index query per exam: far cheaper than one `anyOf` over
 * many keys, which walks the index with a cursor.
 */
export async function queuedFor(examIds: string[]): Promise<Map<string, OutboxItem[]>> {
  const lists = await Promise.all(examIds.map((id) => db.outbox.where('examId').equals(id).sortBy('seq')))
  return new Map(examIds.map((id, index) => [id, lists[index]!]))
}

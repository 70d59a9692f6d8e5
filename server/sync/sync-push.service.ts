import { SYNC_PUSH_LIMIT, type SyncChange, type SyncResult } from '#shared/schemas/sync'
import type { User } from '#shared/schemas/user'
import { AppError } from '../errors.ts'
import { applyCreates } from './sync-create.ts'
import { checkItem, type SyncBatchItem } from './sync-items.ts'
import { rejected } from './sync-results.ts'
import { applyUpdate } from './sync-update.ts'

const REPEATED = { code: 'repeated-in-batch', message: 'Send one change per exam in a push; this one came after another for the same exam' }

function repeatedIndexes(changes: SyncBatchItem[]): Set<number> {
  const seen = new Set<string>()
  const repeated = new Set<number>()
  changes.forEach((change, index) => {
    if (seen.has(change.exam.id)) repeated.add(index)
    seen.add(change.exam.id)
  })
  return repeated
}

/**
 * Applies a batch of offline changes and answers each in the order sent. A change that is not valid is rejected
 * before anything is looked up; new exams (no base version) are stored together; changes to existing ones go one by
 * one through the exams service. Replaying a batch changes nothing.
 */
export async function pushChanges(author: User, items: SyncBatchItem[]): Promise<SyncResult[]> {
  if (items.length > SYNC_PUSH_LIMIT) throw new AppError('batch-too-large', 413, `Send at most ${SYNC_PUSH_LIMIT} changes in one push`)
  const repeated = repeatedIndexes(items)
  const checked = items.map((item, index) => (repeated.has(index) ? rejected(item.exam.id, REPEATED) : checkItem(item)))
  const changes = checked.filter((c): c is SyncChange => !('result' in c))
  const created = await applyCreates(author, changes.filter((change) => !change.baseVersion))
  const results: SyncResult[] = []
  for (const outcome of checked) {
    if ('result' in outcome) results.push(outcome)
    else if (!outcome.baseVersion) results.push(created.get(outcome.exam.id)!)
    else results.push(await applyUpdate(author, outcome))
  }
  return results
}

import { SYNC_PUSH_LIMIT, type SyncChange, type SyncResult } from '#shared/schemas/sync'
import type { User } from '#shared/schemas/user'
import { AppError } from '../errors.ts'
import { applyCreates } from './sync-create.ts'
import { rejected } from './sync-results.ts'
import { applyUpdate } from './sync-update.ts'

const REPEATED = { code: 'repeated-in-batch', message: 'Send one change per exam in a push; this one came after another for the same exam' }

function repeatedIndexes(changes: SyncChange[]): Set<number> {
  const seen = new Set<string>()
  const repeated = new Set<number>()
  changes.forEach((change, index) => {
    if (seen.has(change.exam.id)) repeated.add(index)
    seen.add(change.exam.id)
  })
  return repeated
}

/**
 * Applies a batch of offline changes and answers each in the order sent. New exams (no base version) are stored
 * together; changes to existing ones go one by one through the exams service. Replaying a batch changes nothing.
 */
export async function pushChanges(author: User, changes: SyncChange[]): Promise<SyncResult[]> {
  if (changes.length > SYNC_PUSH_LIMIT) throw new AppError('batch-too-large', 413, `Send at most ${SYNC_PUSH_LIMIT} changes in one push`)
  const repeated = repeatedIndexes(changes)
  const created = await applyCreates(author, changes.filter((change, index) => !repeated.has(index) && !change.baseVersion))
  const results: SyncResult[] = []
  for (const [index, change] of changes.entries()) {
    if (repeated.has(index)) results.push(rejected(change.exam.id, REPEATED))
    else if (!change.baseVersion) results.push(created.get(change.exam.id)!)
    else results.push(await applyUpdate(author, change))
  }
  return results
}

import { ExamInputSchema, type ExamInput } from '#shared/schemas/exam'
import type { SyncChange, SyncResult } from '#shared/schemas/sync'
import type { User } from '#shared/schemas/user'
import { isRetryOf } from '../exams/exam-record.ts'
import { updateExam } from '../exams/exams.service.ts'
import { ExamModel } from '../models/index.ts'
import { applied, duplicate, resultOfError, serverCopyOf } from './sync-results.ts'

/** The author's stored row already holds exactly this content: a retry whose answer was lost. */
async function duplicateOf(author: User, input: ExamInput): Promise<SyncResult | null> {
  const row = await ExamModel.findByPk(input.id)
  return row && isRetryOf(row, author, input) ? duplicate(input.id, row.version) : null
}

/** A change to an exam the server holds, through the exams service, which checks the base version, the lock and the author. */
export async function applyUpdate(author: User, change: SyncChange): Promise<SyncResult> {
  const id = change.exam.id
  const baseVersion = change.baseVersion ?? 0
  let input: ExamInput | undefined
  try {
    input = ExamInputSchema.parse(change.exam)
    const stored = await duplicateOf(author, input)
    if (stored) return stored
    const { id: _id, ...fields } = input
    return applied(id, (await updateExam(author, id, { ...fields, baseVersion })).version)
  } catch (e) {
    // Two pushes of one change can race: the loser finds the winner's identical content, which is not a conflict.
    const same = input && serverCopyOf(e) ? await duplicateOf(author, input) : null
    return same ?? resultOfError(id, baseVersion, e)
  }
}

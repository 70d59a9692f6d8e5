import type { Transaction } from 'sequelize'
import type { User } from '#shared/schemas/user'
import { AppError } from '../errors.ts'
import { canRead, checkBaseVersion, conflict, examNotFound } from '../exams/exam-writes.ts'
import { isAuthor } from '../exams/exam-rules.ts'
import { ExamModel, SignatureModel } from '../models/index.ts'
import { belongsTo } from '../users/team-members.ts'

/** The exam a reviewer may countersign or return: only an attending of the exam's own team, never its author. */
export async function reviewedRow(reviewer: User, id: string, transaction?: Transaction): Promise<ExamModel> {
  const row = await ExamModel.findByPk(id, { transaction })
  if (!row || !(await canRead(reviewer, id, transaction))) throw examNotFound()
  if (isAuthor(row, reviewer)) throw new AppError('own-exam', 403, 'Nobody countersigns or returns their own exam')
  if (!reviewer.roles.includes('attending') || !belongsTo(reviewer, row.teamId))
    throw new AppError('not-team-attending', 403, 'Only an attending of the exam’s team can countersign or return it')
  return row
}

/** Only a submitted exam waits for review; anything else is an illegal transition. */
export async function checkSubmitted(row: ExamModel, baseVersion: number | undefined): Promise<void> {
  if (row.status !== 'submitted')
    throw await conflict(row, 'not-submitted', `This exam is ${row.status}; only a submitted exam can be countersigned or returned`)
  if (await SignatureModel.count({ where: { readingExamId: row.id } }))
    throw await conflict(
      row,
      'attending-reading',
      'This is an attending’s reading taken at a countersignature; it needs no countersignature',
    )
  await checkBaseVersion(row, baseVersion)
}

/** SQL for the exams that are attendings' readings taken at a countersignature: never in a sign-off queue. */
export const READING_EXAM_IDS = '(SELECT "readingExamId" FROM "signatures" WHERE "readingExamId" IS NOT NULL)'

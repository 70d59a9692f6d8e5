import { ExamInputSchema, type Exam, type ExamInput } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { ExamModel } from '../models/index.ts'
import { isAuthor } from './exam-rules.ts'
import { presentPage } from './exam-page.ts'
import { sortedJson, storedInput } from './exam-columns.ts'

export { columnsOf, storedInput } from './exam-columns.ts'

/** Rows as the API's exam shape, with names and signatures joined and the patient code as the reader may see it. */
export const present = presentPage

/** The author's own view of one row. */
export async function presentOwn(row: ExamModel): Promise<Exam> {
  const [exam] = await present([row], (r) => r.patientCode)
  return exam!
}

/** The record's content: the band the examiner reviewed travels with a save but is not part of the record. */
function canonical({ reviewed: _reviewed, ...input }: ExamInput): string {
  return sortedJson({
    ...input,
    examinedAt: new Date(input.examinedAt).toISOString(),
    heightCm: input.heightCm ?? null,
    alongNeckCm: input.alongNeckCm ?? null,
    roundId: input.roundId ?? null,
    notAssessableReason: input.notAssessableReason ?? null,
    notAssessableText: input.notAssessableText ?? null,
  })
}

/** The author's stored row already holds exactly this content: a retry whose answer was lost, not a new write. */
export const isRetryOf = (row: ExamModel, author: User, input: ExamInput): boolean => isAuthor(row, author) && sameRecord(row, input)

/** Whether a stored row holds exactly this record, however the client wrote the time or ordered the keys. */
export function sameRecord(row: ExamModel, input: ExamInput): boolean {
  const stored = ExamInputSchema.safeParse(storedInput(row))
  return stored.success && canonical(stored.data) === canonical(input)
}

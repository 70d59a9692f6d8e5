import { z } from 'zod'
import { ExamInputSchema } from '#shared/schemas/exam'
import { lowerUuid } from '#shared/schemas/fields'
import { SyncChangeSchema, type SyncChange, type SyncResult } from '#shared/schemas/sync'
import { fieldsOf } from '../errors.ts'
import { invalid, rejected } from './sync-results.ts'

/**
 * A push as far as it must be read whole: a list of changes, each with its exam's id to answer by. Everything else
 * is checked change by change, so one bad record does not fail the batch.
 */
export const SyncBatchSchema = z.object({
  changes: z.array(z.looseObject({ exam: z.looseObject({ id: z.string('Each change needs the exam id').transform(lowerUuid) }) })),
})
export type SyncBatchItem = z.infer<typeof SyncBatchSchema>['changes'][number]

/**
 * One change, checked before anything is looked up: its base version and the whole record. A change that
 * fails is answered `rejected` with its field errors, keyed as the exams API keys them.
 */
export function checkItem(item: SyncBatchItem): SyncChange | SyncResult {
  const id = item.exam.id
  const change = SyncChangeSchema.safeParse(item)
  if (!change.success) return rejected(id, invalid(fieldsOf(change.error)))
  const record = ExamInputSchema.safeParse(change.data.exam)
  return record.success ? change.data : rejected(id, invalid(fieldsOf(record.error)))
}

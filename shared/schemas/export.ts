import type { z } from 'zod'
import { ExamListQuerySchema } from './exam.ts'

/**
 * Filters of `GET /api/exports/exams.csv`: the exam log's filters without its paging and sort. A search by patient
 * code stays within the rows the reader sees unmasked, as in the log.
 */
export const ExamExportQuerySchema = ExamListQuerySchema.pick({
  status: true,
  teamId: true,
  examinerId: true,
  patientCode: true,
  from: true,
  to: true,
})
export type ExamExportQuery = z.infer<typeof ExamExportQuerySchema>

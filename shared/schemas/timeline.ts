import { z } from 'zod'
import { ExamSchema } from './exam.ts'
import { ReferenceSchema } from './reference.ts'

/**
 * `GET /api/patients/:code/timeline`: every exam of one patient code within the reader's clinical scope, oldest
 * first, each with its stored estimate, and the references recorded beside them. Educators and admins get 403.
 */
export const PatientTimelineSchema = z.object({
  patientCode: z.string(),
  exams: z.array(ExamSchema),
  references: z.array(ReferenceSchema),
  caution: z.string(),
})
export type PatientTimeline = z.infer<typeof PatientTimelineSchema>

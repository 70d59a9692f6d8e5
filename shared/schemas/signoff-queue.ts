import { z } from 'zod'
import { ExamSchema } from './exam.ts'

export const SignoffQueueQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
})
export type SignoffQueueQuery = z.infer<typeof SignoffQueueQuerySchema>

export const SignoffQueueItemSchema = z.object({
  exam: ExamSchema,
  /** Seconds since submission, by the server's clock. */
  waitingSeconds: z.number().int(),
})
export type SignoffQueueItem = z.infer<typeof SignoffQueueItemSchema>

/** Submitted exams waiting for the attending, oldest submission first. */
export const SignoffQueueSchema = z.object({
  items: z.array(SignoffQueueItemSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
})
export type SignoffQueue = z.infer<typeof SignoffQueueSchema>

export const SignoffQueueCountSchema = z.object({ count: z.number().int() })

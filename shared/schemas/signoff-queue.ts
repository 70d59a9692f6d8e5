import { z } from 'zod'
import { ExamSchema } from './exam.ts'

export const SignoffQueueQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
  /** The `nextCursor` of the page before: the page after it, however long the queue. */
  cursor: z.string().max(400).optional(),
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
  /** Waiting exams, counted up to 10,000 (`EXAM_COUNT_CAP`). */
  total: z.number().int(),
  /** More exams wait than `total` says. */
  totalCapped: z.boolean().default(false),
  page: z.number().int(),
  pageSize: z.number().int(),
  /** Opaque: send it as `cursor` for the next page; null on the last page. */
  nextCursor: z.string().nullable().default(null),
})
export type SignoffQueue = z.infer<typeof SignoffQueueSchema>

export const SignoffQueueCountSchema = z.object({ count: z.number().int() })

import { z } from 'zod'
import { ExamSchema } from './exam.ts'

/** `oldest`: the longest-waiting first (the default); `newest`: the latest submission first. */
export const SignoffQueueOrderSchema = z.enum(['oldest', 'newest'])
export type SignoffQueueOrder = z.infer<typeof SignoffQueueOrderSchema>

export const SignoffQueueQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
  /** The `nextCursor` of the page before: the page after it, however long the queue. Send the same order and filters. */
  cursor: z.string().max(400).optional(),
  order: SignoffQueueOrderSchema.default('oldest'),
  /** Part of the resident's name or of the patient code, without case; blank means no search. */
  q: z
    .string()
    .trim()
    .max(100, 'Search with at most 100 characters')
    .optional()
    .transform((text) => text || undefined),
  /** Only this resident's exams. */
  residentId: z.string().min(1).max(100).optional(),
})
export type SignoffQueueQuery = z.infer<typeof SignoffQueueQuerySchema>

export const SignoffQueueItemSchema = z.object({
  exam: ExamSchema,
  /** Seconds since submission, by the server's clock. */
  waitingSeconds: z.number().int(),
})
export type SignoffQueueItem = z.infer<typeof SignoffQueueItemSchema>

/** Submitted exams waiting for the attending, in the order asked for. */
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

/** One resident with exams in the attending's queue, and how many. */
export const SignoffQueueResidentSchema = z.object({ residentId: z.string(), name: z.string(), count: z.number().int() })
export type SignoffQueueResident = z.infer<typeof SignoffQueueResidentSchema>

/** Everyone with exams waiting for the attending, by name (the whole queue, whatever the search). */
export const SignoffQueueResidentsSchema = z.object({ residents: z.array(SignoffQueueResidentSchema) })

import { z } from 'zod'
import { ExamSchema } from './exam.ts'
import { lowerUuid } from './fields.ts'

/** At most this many changes travel in one push; a longer batch is answered 413. */
export const SYNC_PUSH_LIMIT = 200
/** The most exams one pull page may ask for. */
export const SYNC_PULL_LIMIT = 500

export const SyncChangeSchema = z.object({
  /** The whole record as the client holds it; checked item by item, so one bad record does not fail the batch. */
  exam: z.looseObject({ id: z.string('Each change needs the exam id').transform(lowerUuid) }),
  /** The server version the change was made on; null or 0 for an exam the server has never acknowledged. */
  baseVersion: z.number().int().min(0).nullable().default(null),
})
export type SyncChange = z.infer<typeof SyncChangeSchema>
export type SyncChangeInput = z.input<typeof SyncChangeSchema>

export const SyncPushSchema = z.object({ changes: z.array(SyncChangeSchema) })
export type SyncPush = z.infer<typeof SyncPushSchema>

export const SyncItemErrorSchema = z.object({
  code: z.string(),
  message: z.string(),
  fields: z.record(z.string(), z.string()).optional(),
})
export type SyncItemError = z.infer<typeof SyncItemErrorSchema>

/** One answer per change, in the order sent. */
export const SyncResultSchema = z.discriminatedUnion('result', [
  z.object({ id: z.string(), result: z.literal('applied'), version: z.number().int() }),
  /** The same content was already stored: the retry of a push whose answer was lost. */
  z.object({ id: z.string(), result: z.literal('duplicate'), version: z.number().int() }),
  /** The change was based on an older version; nothing was written and this is the server's copy. */
  z.object({ id: z.string(), result: z.literal('conflict'), exam: ExamSchema }),
  /** The server refused this one change (invalid, forbidden, locked); the rest of the batch is unaffected. */
  z.object({ id: z.string(), result: z.literal('rejected'), error: SyncItemErrorSchema }),
])
export type SyncResult = z.infer<typeof SyncResultSchema>

export const SyncPushResponseSchema = z.object({ results: z.array(SyncResultSchema) })
export type SyncPushResponse = z.infer<typeof SyncPushResponseSchema>

export const SyncPullQuerySchema = z.object({
  /** The `cursor` of the previous page; 0 (or none) from the start. */
  cursor: z.coerce.number().int().min(0).default(0),
  limit: z.coerce.number().int().min(1).max(SYNC_PULL_LIMIT).default(200),
})
export type SyncPullQuery = z.infer<typeof SyncPullQuerySchema>

/**
 * An exam that changed after the cursor and that the reader may no longer read (an attending's copy of an exam its
 * author amended back to draft): only its id and the change's place in the cursor order, never its content.
 */
export const SyncRemovedSchema = z.object({ id: z.string(), syncSeq: z.number().int() })
export type SyncRemoved = z.infer<typeof SyncRemovedSchema>

/**
 * Exams the reader may see that changed after the cursor, oldest change first, and the ids of those they no longer
 * may (to drop from the device); ask again with `cursor` while `more`. Each change is in one page, in one of the two
 * lists. `removed` is absent from servers older than it.
 */
export const SyncPullResponseSchema = z.object({
  exams: z.array(ExamSchema),
  removed: z.array(SyncRemovedSchema).optional(),
  cursor: z.number().int(),
  more: z.boolean(),
})
export type SyncPullResponse = z.infer<typeof SyncPullResponseSchema>

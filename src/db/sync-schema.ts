import { z } from 'zod'
import { ExamSchema } from '#shared/schemas/exam'
import { SyncItemErrorSchema } from '#shared/schemas/sync'

/**
 * `pending` waits for the server; `needs-attention` was refused (its field errors in `lastError`); `conflict` met a
 * newer server version (kept in `serverCopy`) and waits for the user to choose.
 */
export const OutboxStateSchema = z.enum(['pending', 'needs-attention', 'conflict'])
export type OutboxState = z.infer<typeof OutboxStateSchema>

/** One saved change waiting for the server's acknowledgement, bound to the account that made it. */
export const OutboxItemSchema = z.object({
  seq: z.number().int(),
  examId: z.string(),
  authorId: z.string(),
  /** The whole record as saved: the server validates it and recomputes the estimate. */
  payload: z.looseObject({ id: z.string() }),
  /** The server version the change was made on; null while the server has never acknowledged the exam. */
  baseVersion: z.number().int().nullable(),
  state: OutboxStateSchema,
  attempts: z.number().int().catch(0),
  lastError: SyncItemErrorSchema.nullable().catch(null),
  serverCopy: ExamSchema.nullable().catch(null),
  queuedAt: z.string(),
})
export type OutboxItem = z.infer<typeof OutboxItemSchema>
export type NewOutboxItem = Omit<OutboxItem, 'seq'>

/** An exam kept on this device for reading offline: the server's copy, or the local one while it waits in the outbox. */
export const LocalExamSchema = ExamSchema.extend({ ownerId: z.string() })
export type LocalExam = z.infer<typeof LocalExamSchema>

export interface MetaRow {
  key: string
  value: unknown
}

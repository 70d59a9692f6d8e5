import { z } from 'zod'

/** One message the demo's fake SMTP server caught. */
export const MailboxMessageSchema = z.object({
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  receivedAt: z.iso.datetime(),
})
export type MailboxMessage = z.infer<typeof MailboxMessageSchema>

/** `GET /api/mailbox`: newest first. */
export const MailboxSchema = z.object({ messages: z.array(MailboxMessageSchema) })
export type Mailbox = z.infer<typeof MailboxSchema>

/** Queued until delivered (`sent`) or given up after the last allowed attempt or a permanent refusal (`failed`). */
export const OutboxStatusSchema = z.enum(['queued', 'sent', 'failed'])
export type OutboxStatus = z.infer<typeof OutboxStatusSchema>

/** One message of the durable outbox, one per recipient; its body is never shown (it may hold a one-time link). */
export const OutboxMessageSchema = z.object({
  id: z.string(),
  template: z.string(),
  recipient: z.string(),
  subject: z.string(),
  status: OutboxStatusSchema,
  attempts: z.number().int(),
  /** When the next attempt is due; null once sent or failed. */
  nextAttemptAt: z.iso.datetime().nullable(),
  /** The last failed attempt's error code and the relay's reply. */
  lastError: z.string().nullable(),
  createdAt: z.iso.datetime(),
  sentAt: z.iso.datetime().nullable(),
})
export type OutboxMessage = z.infer<typeof OutboxMessageSchema>

export const OutboxQuerySchema = z.object({
  status: OutboxStatusSchema.optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
})
export type OutboxQuery = z.infer<typeof OutboxQuerySchema>

/** `GET /api/mailbox/outbox`: the newest messages first, and how many the outbox holds in each status. */
export const OutboxSchema = z.object({
  messages: z.array(OutboxMessageSchema),
  counts: z.object({ queued: z.number().int(), sent: z.number().int(), failed: z.number().int() }),
})
export type Outbox = z.infer<typeof OutboxSchema>

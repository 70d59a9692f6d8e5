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

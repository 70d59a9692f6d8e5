import { isHTTPError } from 'ky'
import { MailboxSchema, OutboxSchema, type OutboxQuery } from '#shared/schemas/mail'
import { api } from './client'

/** What the demo's SMTP catcher received, newest first; null where no catcher runs (the server answers 404). */
export async function fetchMailbox() {
  try {
    return MailboxSchema.parse(await api.get('mailbox').json()).messages
  } catch (e) {
    if (isHTTPError(e) && e.response.status === 404) return null
    throw e
  }
}

/** The outbox's newest messages with their delivery status, and the counts per status; null where the server has no such route. */
export async function fetchOutbox(query: Partial<OutboxQuery> = {}) {
  const searchParams = Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined)) as Record<string, string | number>
  try {
    return OutboxSchema.parse(await api.get('mailbox/outbox', { searchParams }).json())
  } catch (e) {
    if (isHTTPError(e) && e.response.status === 404) return null
    throw e
  }
}

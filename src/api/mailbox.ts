import { isHTTPError } from 'ky'
import { MailboxSchema } from '#shared/schemas/mail'
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

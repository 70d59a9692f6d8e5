import { body, dateTimeText, link, type MailMessage, type TemplateContext } from './template-parts.ts'

interface TokenLink extends TemplateContext {
  to: string
  token: string
  expiresAt: Date | string
}

// Tokens ride in the fragment, which browsers never send to the server or its logs.
function tokenLink(baseUrl: string, path: string, token: string): string {
  return link(baseUrl, `${path}#token=${encodeURIComponent(token)}`)
}

/** To a new account holder, with the link that lets them set a password. */
export function invitation(p: TokenLink & { inviterName: string; displayName: string }): MailMessage {
  return {
    template: 'invitation',
    to: [p.to],
    subject: `${p.inviterName} invites you to Plumbline`,
    text: body(
      `Hello ${p.displayName},`,
      `${p.inviterName} has made you a Plumbline account for recording the jugular venous pressure exam at the bedside.`,
      `Choose your password here: ${tokenLink(p.baseUrl, '/invitation', p.token)}`,
      `The link works once, until ${dateTimeText(p.expiresAt, p.timeZone, p.locale)}.`,
    ),
  }
}

/** To an account holder who asked to reset their password. */
export function passwordReset(p: TokenLink): MailMessage {
  return {
    template: 'password-reset',
    to: [p.to],
    subject: 'Reset your Plumbline password',
    text: body(
      `Someone asked to reset the password of this Plumbline account. Choose a new one here: ${tokenLink(p.baseUrl, '/reset-password', p.token)}`,
      `The link works once, until ${dateTimeText(p.expiresAt, p.timeZone, p.locale)}. If you did not ask, ignore this message; your password stays as it is.`,
    ),
  }
}

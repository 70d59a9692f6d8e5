import type { Transaction } from 'sequelize'
import { audit } from '../audit.ts'
import { AppError } from '../errors.ts'
import { invitation } from '../mail/account-templates.ts'
import type { MailDeps } from '../mail/mailer.ts'
import { UserModel } from '../models/index.ts'
import { issueLink } from './account-links.ts'

export interface SendInvitationOptions extends MailDeps {
  userId: string
  /** The admin sending it; named in the e-mail and the audit trail. */
  invitedBy: string
  /** When given, the link and the e-mail are written inside it; the e-mail leaves only after it commits. */
  transaction?: Transaction
}

/**
 * Issues a 7-day, single-use invitation link for an account that has no password yet and e-mails it; any earlier
 * unused invitation link of the account stops working. Stamps `invitedAt` and appends an `invitation-sent` event.
 * Refuses (409) an account that already chose a password or is deactivated. Without any mailer (API tests without
 * one) the link is still issued and audited, but nothing is sent.
 */
export async function sendInvitation(opts: SendInvitationOptions): Promise<void> {
  const { userId, invitedBy, transaction, mailer, baseUrl } = opts
  const user = await UserModel.findByPk(userId, { transaction })
  if (!user) throw new AppError('not-found', 404, 'No such account')
  if (!user.active) throw new AppError('account-deactivated', 409, 'This account is deactivated; reactivate it first')
  if (user.passwordHash) throw new AppError('already-set-up', 409, 'This person has already chosen a password')
  const inviter = await UserModel.findByPk(invitedBy, { transaction })
  const link = await issueLink(user.id, 'invitation', invitedBy, transaction)
  user.invitedAt = new Date()
  await user.save({ transaction })
  await audit(
    {
      actorId: invitedBy,
      action: 'invitation-sent',
      entityType: 'user',
      entityId: user.id,
      changes: { email: user.email, expiresAt: link.expiresAt.toISOString() },
    },
    { transaction },
  )
  if (!mailer) return
  const message = invitation({
    baseUrl,
    to: user.email,
    token: link.token,
    expiresAt: link.expiresAt,
    inviterName: inviter?.displayName ?? 'Your Plumbline administrator',
    displayName: user.displayName,
  })
  // In the outbox inside the same transaction: it leaves after the commit, and never when the transaction rolls back.
  await mailer.enqueue(message, { transaction })
}

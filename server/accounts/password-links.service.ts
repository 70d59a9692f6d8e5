import type { PasswordResetRequest, SetPasswordInput, SetPasswordResult } from '#shared/schemas/account'
import { audit } from '../audit.ts'
import { hashPassword } from '../auth/passwords.ts'
import { writeTransaction } from '../db/transaction.ts'
import { invalidInput } from '../errors.ts'
import { passwordReset } from '../mail/account-templates.ts'
import type { MailDeps } from '../mail/mailer.ts'
import { RefreshSessionModel, UserModel } from '../models/index.ts'
import { findUsableLink, consumeLink, issueLink } from './account-links.ts'
import { passwordProblem } from './password-policy.ts'

/**
 * Handles `POST /api/auth/password-reset` after the caller has already been answered (see the route): sends a
 * 1-hour reset link only when an active account has the address. An unknown address leaves only an audit event
 * without the address, so the trail neither reveals nor stores what strangers typed.
 */
export async function requestPasswordReset(input: PasswordResetRequest, mail: MailDeps): Promise<void> {
  const user = await UserModel.findOne({ where: { email: input.email } })
  if (!user?.active) {
    await audit({ actorId: null, action: 'password-reset-requested', entityType: 'user', changes: { sent: false } })
    return
  }
  const link = await issueLink(user.id, 'reset', null)
  await audit({
    actorId: null,
    action: 'password-reset-requested',
    entityType: 'user',
    entityId: user.id,
    changes: { sent: true, expiresAt: link.expiresAt.toISOString() },
  })
  mail.mailer?.send(passwordReset({ baseUrl: mail.baseUrl, to: user.email, token: link.token, expiresAt: link.expiresAt }))
}

/**
 * Sets the password through an invitation or reset link: the link must exist, be unused, unexpired and belong to an
 * active account (otherwise one `invalid-link` answer for all), and the password must pass the policy (400 with
 * `fields.password`, the link stays usable). On success the link is spent, every other open link of the account
 * closes, and every refresh session of the account is revoked; older access tokens fail at requireAuth.
 */
export async function setPasswordWithLink(input: SetPasswordInput): Promise<SetPasswordResult> {
  const { user } = await findUsableLink(input.token)
  const problem = passwordProblem(input.password, user.email)
  if (problem) throw invalidInput({ password: problem })
  // Hashed before the transaction: bcrypt takes a few hundred milliseconds and must not hold the write lock.
  const passwordHash = await hashPassword(input.password)
  return writeTransaction(UserModel.sequelize!, async (transaction) => {
    const { link, user: fresh } = await findUsableLink(input.token, transaction)
    await consumeLink(link, transaction)
    const now = new Date()
    fresh.passwordHash = passwordHash
    fresh.passwordChangedAt = now
    await fresh.save({ transaction })
    const [revoked] = await RefreshSessionModel.update(
      { revokedAt: now },
      { where: { userId: fresh.id, revokedAt: null }, transaction },
    )
    await audit(
      {
        actorId: fresh.id,
        action: link.purpose === 'invitation' ? 'invitation-accepted' : 'password-reset-used',
        entityType: 'user',
        entityId: fresh.id,
        changes: { revokedSessions: revoked },
      },
      { transaction },
    )
    return { email: fresh.email, purpose: link.purpose }
  })
}

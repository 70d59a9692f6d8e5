import { randomUUID } from 'node:crypto'
import { Op, type Transaction } from 'sequelize'
import { AppError } from '../errors.ts'
import { AccountLinkModel, UserModel } from '../models/index.ts'
import type { AccountLinkPurpose } from '../models/account-link.ts'
import { hashToken, newOpaqueToken } from '../auth/tokens.ts'

/**
 * How long a link works. OWASP ASVS 4.0.3 2.3.1 asks that activation codes and
 * initial secrets "expire after a short period of time", and the OWASP Forgot Password Cheat Sheet that reset tokens
 * expire; the numbers themselves are common practice, no source: a reset is asked for by someone waiting at a screen,
 * so 1 hour; an invitation may reach a resident on nights or on leave, so 7 days.
 */
export const LINK_TTL_MS: Record<AccountLinkPurpose, number> = {
  invitation: 7 * 24 * 60 * 60 * 1000,
  reset: 60 * 60 * 1000,
}

export interface IssuedLink {
  /** Goes into the e-mail only; the database keeps its SHA-256. */
  token: string
  expiresAt: Date
}

/** A new one-time link; any earlier unused link of the same purpose for the account stops working. */
export async function issueLink(
  userId: string,
  purpose: AccountLinkPurpose,
  createdBy: string | null,
  transaction?: Transaction,
): Promise<IssuedLink> {
  const now = new Date()
  await AccountLinkModel.update(
    { expiresAt: now },
    { where: { userId, purpose, usedAt: null, expiresAt: { [Op.gt]: now } }, transaction },
  )
  const token = newOpaqueToken()
  const expiresAt = new Date(now.getTime() + LINK_TTL_MS[purpose])
  await AccountLinkModel.create(
    { id: randomUUID(), userId, purpose, tokenHash: hashToken(token), expiresAt, usedAt: null, createdBy },
    { transaction },
  )
  return { token, expiresAt }
}

/** One answer for an unknown, used or expired link and for a deactivated account, so none can be told apart. */
export function invalidLink(): AppError {
  return new AppError(
    'invalid-link',
    400,
    'This link does not work any more: links work once and expire. Ask for a new one.',
  )
}

/** The usable link behind a token and its account, or the one "invalid link" error. */
export async function findUsableLink(token: string, transaction?: Transaction) {
  const link = await AccountLinkModel.findOne({ where: { tokenHash: hashToken(token) }, transaction })
  if (!link || link.usedAt || link.expiresAt.getTime() <= Date.now()) throw invalidLink()
  const user = await UserModel.findByPk(link.userId, { transaction })
  if (!user?.active) throw invalidLink()
  return { link, user }
}

/**
 * Marks the link used, atomically: of two requests racing with the same token only one changes the row.
 * Every other unused link of the account is closed too, so an old invitation cannot set the password again.
 */
export async function consumeLink(link: AccountLinkModel, transaction: Transaction): Promise<void> {
  const now = new Date()
  const [changed] = await AccountLinkModel.update(
    { usedAt: now },
    { where: { id: link.id, usedAt: null, expiresAt: { [Op.gt]: now } }, transaction },
  )
  if (changed !== 1) throw invalidLink()
  await AccountLinkModel.update(
    { expiresAt: now },
    { where: { userId: link.userId, usedAt: null, expiresAt: { [Op.gt]: now } }, transaction },
  )
}

import { randomUUID } from 'node:crypto'
import type { LoginInput, Session, User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { AppError } from '../errors.ts'
import { RefreshSessionModel, UserModel } from '../models/index.ts'
import { getUser } from '../users/users.service.ts'
import { hashPassword, needsRehash, verifyPassword } from './passwords.ts'
import { hashToken, newOpaqueToken, signAccessToken } from './tokens.ts'

export const REFRESH_TTL_MS = 12 * 60 * 60 * 1000

export interface IssuedSession extends Session {
  refreshToken: string
}

const invalidCredentials = () => new AppError('invalid-credentials', 401, 'E-mail or password is not right')

async function issue(secret: string, user: User, familyId: string): Promise<IssuedSession> {
  const refreshToken = newOpaqueToken()
  await RefreshSessionModel.create({
    id: randomUUID(),
    userId: user.id,
    familyId,
    tokenHash: hashToken(refreshToken),
    expiresAt: new Date(Date.now() + REFRESH_TTL_MS),
    revokedAt: null,
  })
  return { token: signAccessToken(secret, { sub: user.id, roles: user.roles }), user, refreshToken }
}

/** Unknown e-mail and wrong password give the same answer, so accounts cannot be enumerated. */
export async function login(secret: string, input: LoginInput): Promise<IssuedSession> {
  const row = await UserModel.findOne({ where: { email: input.email } })
  const ok = await verifyPassword(input.password, row?.passwordHash ?? null)
  if (!row || !ok || !row.active) {
    await audit({ actorId: row?.id ?? null, action: 'login-failed', entityType: 'user', entityId: row?.id })
    throw invalidCredentials()
  }
  // Accounts hashed under an older, lower work factor are brought up to today's while the password is at hand.
  if (needsRehash(row.passwordHash!)) await row.update({ passwordHash: await hashPassword(input.password) })
  await audit({ actorId: row.id, action: 'login', entityType: 'user', entityId: row.id })
  return issue(secret, (await getUser(row.id))!, randomUUID())
}

/** Rotates the refresh token; a token presented twice revokes its whole family (stolen-token reuse). */
export async function refresh(secret: string, token: string | undefined): Promise<IssuedSession> {
  const expired = () => new AppError('session-expired', 401, 'Your session has ended; sign in again')
  if (!token) throw expired()
  const row = await RefreshSessionModel.findOne({ where: { tokenHash: hashToken(token) } })
  if (!row) throw expired()
  // One conditional update claims the token: of two refreshes with the same token at the same moment, only one sees
  // it unrevoked; the other is treated as reuse and ends the family.
  const [claimed] = await RefreshSessionModel.update({ revokedAt: new Date() }, { where: { id: row.id, revokedAt: null } })
  if (claimed !== 1) {
    await RefreshSessionModel.update({ revokedAt: new Date() }, { where: { familyId: row.familyId, revokedAt: null } })
    throw expired()
  }
  const user = await getUser(row.userId)
  if (row.expiresAt.getTime() < Date.now() || !user?.active) throw expired()
  return issue(secret, user, row.familyId)
}

export async function logout(token: string | undefined): Promise<void> {
  if (!token) return
  const row = await RefreshSessionModel.findOne({ where: { tokenHash: hashToken(token) } })
  if (!row) return
  await RefreshSessionModel.update({ revokedAt: new Date() }, { where: { familyId: row.familyId, revokedAt: null } })
  await audit({ actorId: row.userId, action: 'logout', entityType: 'user', entityId: row.userId })
}

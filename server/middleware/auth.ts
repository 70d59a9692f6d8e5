import type { NextFunction, Request, Response } from 'express'
import type { Role, User } from '#shared/schemas/user'
import { verifyAccessToken } from '../auth/tokens.ts'
import { AppError } from '../errors.ts'
import { getAuthState, type ReadFacts } from '../users/auth-state.ts'

/**
 * Verifies the bearer token and loads the account, which must still be active: a deactivated account's access tokens
 * (15 minutes at most, ACCESS_TTL_SECONDS) stop working at its next request. A token issued before the password last
 * changed (a reset link was used) is refused too, so a reset ends every session at once, not only the refresh ones.
 * The account, roles and teams come from one query per request (users/auth-state.ts): nothing about them is cached.
 * The same query reads what exam reads are scoped and cached by (`readFacts`).
 */
export function requireAuth(secret: string) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const header = req.get('authorization') ?? ''
    const match = /^Bearer (\S+)$/.exec(header)
    if (!match?.[1]) throw new AppError('not-signed-in', 401, 'Sign in to continue')
    const claims = verifyAccessToken(secret, match[1])
    const state = await getAuthState(claims.sub)
    if (!state?.user.active) throw new AppError('invalid-token', 401, 'Your session is not valid; sign in again')
    // `iat` has whole seconds: a token from the same second as the change still passes.
    const changedAt = state.passwordChangedAt ? Math.floor(state.passwordChangedAt.getTime() / 1000) : null
    if (changedAt !== null && claims.iat !== undefined && claims.iat < changedAt) {
      throw new AppError('invalid-token', 401, 'Your session is not valid; sign in again')
    }
    res.locals.user = state.user
    res.locals.readFacts = state.facts
    next()
  }
}

export function currentUser(res: Response): User {
  const user = res.locals.user as User | undefined
  if (!user) throw new AppError('not-signed-in', 401, 'Sign in to continue')
  return user
}

/** What the account's statement read besides the account, for exam reads (exams/exam-answers.ts); absent without requireAuth. */
export function readFacts(res: Response): ReadFacts | undefined {
  return res.locals.readFacts as ReadFacts | undefined
}

/** Deny by default: the request passes only when the account holds one of the roles. */
export function requireRole(...roles: Role[]) {
  return (_req: Request, res: Response, next: NextFunction) => {
    if (!currentUser(res).roles.some((r) => roles.includes(r))) {
      throw new AppError('forbidden', 403, 'Your role does not allow this')
    }
    next()
  }
}

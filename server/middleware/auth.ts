import type { NextFunction, Request, Response } from 'express'
import type { Role, User } from '#shared/schemas/user'
import { verifyAccessToken } from '../auth/tokens.ts'
import { AppError } from '../errors.ts'
import { getUser } from '../users/users.service.ts'

/** Verifies the bearer token and loads the account, which must still be active. */
export function requireAuth(secret: string) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const header = req.get('authorization') ?? ''
    const match = /^Bearer (\S+)$/.exec(header)
    if (!match?.[1]) throw new AppError('not-signed-in', 401, 'Sign in to continue')
    const claims = verifyAccessToken(secret, match[1])
    const user = await getUser(claims.sub)
    if (!user?.active) throw new AppError('invalid-token', 401, 'Your session is not valid; sign in again')
    res.locals.user = user
    next()
  }
}

export function currentUser(res: Response): User {
  const user = res.locals.user as User | undefined
  if (!user) throw new AppError('not-signed-in', 401, 'Sign in to continue')
  return user
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

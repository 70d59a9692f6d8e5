import { Router, type CookieOptions, type Response } from 'express'
import { LoginInputSchema } from '#shared/schemas/user'
import { attemptLimiter, byAddressAndEmail, textCredentials } from '../middleware/rate-limit.ts'
import { login, logout, refresh, REFRESH_TTL_MS, type IssuedSession } from './auth.service.ts'

export const REFRESH_COOKIE = 'plumbline_refresh'

export interface AuthRouterOptions {
  secret: string
  cookieSecure: boolean
  /** Failed sign-ins allowed per address and e-mail in 15 minutes (ASVS 2.2.1). */
  loginAttempts: number
}

export function authRouter({ secret, cookieSecure, loginAttempts }: AuthRouterOptions): Router {
  const router = Router()
  const cookie: CookieOptions = { httpOnly: true, sameSite: 'strict', secure: cookieSecure, path: '/api/auth' }
  const send = (res: Response, s: IssuedSession) =>
    res.cookie(REFRESH_COOKIE, s.refreshToken, { ...cookie, maxAge: REFRESH_TTL_MS }).json({ token: s.token, user: s.user })
  const message = 'Too many sign-in attempts; wait 15 minutes'
  const limiter = attemptLimiter({ limit: loginAttempts, key: byAddressAndEmail, message, failuresOnly: true })

  router.post('/login', textCredentials('email', 'password'), limiter, async (req, res) =>
    send(res, await login(secret, LoginInputSchema.parse(req.body))),
  )
  // No cookie at all is the normal state of a visitor, not a failure: 204 keeps the sign-in page's probe out of the
  // browser's console errors. A presented token that is invalid or expired still answers 401.
  router.post('/refresh', async (req, res) => {
    const token: unknown = req.cookies?.[REFRESH_COOKIE]
    if (token === undefined) return void res.status(204).end()
    send(res, await refresh(secret, typeof token === 'string' ? token : ''))
  })
  router.post('/logout', async (req, res) => {
    await logout(req.cookies?.[REFRESH_COOKIE])
    res.clearCookie(REFRESH_COOKIE, cookie).status(204).end()
  })
  return router
}

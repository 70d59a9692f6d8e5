import type { Request, RequestHandler } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { AppError, invalidInput } from '../errors.ts'
import { DatabaseStore } from './rate-limit-store.ts'

/** Attempts are counted over 15 minutes (product default, no published source). */
export const ATTEMPT_WINDOW_MS = 15 * 60 * 1000

/** Per client address (IPv6 addresses by their subnet, so one host cannot rotate through its own range). */
export const byAddress = (req: Request): string => ipKeyGenerator(req.ip ?? '')

/** The body's e-mail as the limiter counts it; anything but a string (refused before the limiter) counts as none. */
function emailOf(req: Request): string {
  const email: unknown = (req.body as { email?: unknown } | undefined)?.email
  return typeof email === 'string' ? email.trim().toLowerCase() : ''
}

/** Per address and e-mail in the body, counted alike whether or not an account has that address. Never throws. */
export const byAddressAndEmail = (req: Request): string => `${byAddress(req)}|${emailOf(req)}`

/**
 * Refuses with 400 a body whose named credentials are not text (`{"email": {"toString": 1}}`), before a limiter or
 * a service reads them. A missing field passes: the route's schema names it.
 */
export function textCredentials(...names: string[]): RequestHandler {
  return (req, _res, next) => {
    const body = req.body as Record<string, unknown> | undefined
    const fields: Record<string, string> = {}
    for (const name of names) {
      const value = body && typeof body === 'object' && Object.hasOwn(body, name) ? body[name] : undefined
      if (value !== undefined && typeof value !== 'string') fields[name] = 'Send this as text'
    }
    if (Object.keys(fields).length) throw invalidInput(fields)
    next()
  }
}

export interface AttemptLimit {
  limit: number
  key: (req: Request) => string
  /** What the 429 says; the client shows it as is. */
  message: string
  /** Count only failed attempts (status ≥ 400), so a person who gets it right is never held up. */
  failuresOnly?: boolean
}

/** Counts are kept per route (`/api/auth/login|…`): two limiters keying clients alike never add up each other's attempts. */
const perRoute = (key: AttemptLimit['key']) => (req: Request) => `${req.baseUrl}${String(req.route?.path ?? req.path)}|${key(req)}`

/**
 * A limiter answering the (limit + 1)th attempt in the window with a 429 `too-many-attempts`. Attempts are counted in
 * the database (rate-limit-store.ts), so every app server on it holds a client to the same limit.
 */
export function attemptLimiter({ limit, key, message, failuresOnly = false }: AttemptLimit): RequestHandler {
  return rateLimit({
    windowMs: ATTEMPT_WINDOW_MS,
    limit,
    skipSuccessfulRequests: failuresOnly,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new DatabaseStore(),
    keyGenerator: perRoute(key),
    handler: (_req, _res, next) => next(new AppError('too-many-attempts', 429, message)),
  })
}

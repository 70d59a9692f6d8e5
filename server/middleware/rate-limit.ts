import type { Request, RequestHandler } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { AppError } from '../errors.ts'

/** Attempts are counted over 15 minutes (product default, no published source). */
export const ATTEMPT_WINDOW_MS = 15 * 60 * 1000

/** Per client address (IPv6 addresses by their subnet, so one host cannot rotate through its own range). */
export const byAddress = (req: Request): string => ipKeyGenerator(req.ip ?? '')

/** Per address and e-mail in the body, counted alike whether or not an account has that address. */
export const byAddressAndEmail = (req: Request): string => `${byAddress(req)}|${String(req.body?.email ?? '').trim().toLowerCase()}`

export interface AttemptLimit {
  limit: number
  key: (req: Request) => string
  /** What the 429 says; the client shows it as is. */
  message: string
  /** Count only failed attempts (status ≥ 400), so a person who gets it right is never held up. */
  failuresOnly?: boolean
}

/** A limiter answering the (limit + 1)th attempt in the window with a 429 `too-many-attempts`. */
export function attemptLimiter({ limit, key, message, failuresOnly = false }: AttemptLimit): RequestHandler {
  return rateLimit({
    windowMs: ATTEMPT_WINDOW_MS,
    limit,
    skipSuccessfulRequests: failuresOnly,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new AppError('too-many-attempts', 429, message)),
  })
}

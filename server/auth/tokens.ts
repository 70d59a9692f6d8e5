import { createHash, randomBytes } from 'node:crypto'
import jwt from 'jsonwebtoken'
import { z } from 'zod'
import { RoleSchema } from '#shared/schemas/user'
import { AppError } from '../errors.ts'

export const ISSUER = 'plumbline'
export const AUDIENCE = 'plumbline-api'
export const ACCESS_TTL_SECONDS = 15 * 60

// `iat` (seconds) lets requireAuth refuse tokens issued before the account's password last changed.
const ClaimsSchema = z.object({ sub: z.string(), roles: z.array(RoleSchema), iat: z.number().optional() })
export type Claims = z.infer<typeof ClaimsSchema>

export function signAccessToken(secret: string, claims: Pick<Claims, 'sub' | 'roles'>): string {
  return jwt.sign({ roles: claims.roles }, secret, {
    algorithm: 'HS256',
    subject: claims.sub,
    issuer: ISSUER,
    audience: AUDIENCE,
    expiresIn: ACCESS_TTL_SECONDS,
  })
}

/** ASVS 9.1: signature first, an explicit algorithm list (never `none`), then issuer, audience and expiry. */
export function verifyAccessToken(secret: string, token: string): Claims {
  try {
    const payload = jwt.verify(token, secret, { algorithms: ['HS256'], issuer: ISSUER, audience: AUDIENCE })
    return ClaimsSchema.parse(payload)
  } catch {
    throw new AppError('invalid-token', 401, 'Your session is not valid; sign in again')
  }
}

export function newOpaqueToken(): string {
  return randomBytes(32).toString('base64url')
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

import { createHash, createSecretKey, randomBytes, type KeyObject } from 'node:crypto'
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

const keys = new Map<string, KeyObject>()

/**
 * The HMAC key as a KeyObject, made once per secret: given a string, jsonwebtoken first tries to read it as a public
 * key and builds (and throws away) an error on every call, several milliseconds of CPU per request.
 */
function keyOf(secret: string): KeyObject {
  let key = keys.get(secret)
  if (!key) keys.set(secret, (key = createSecretKey(Buffer.from(secret))))
  return key
}

export function signAccessToken(secret: string, claims: Pick<Claims, 'sub' | 'roles'>): string {
  return jwt.sign({ roles: claims.roles }, keyOf(secret), {
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
    const payload = jwt.verify(token, keyOf(secret), { algorithms: ['HS256'], issuer: ISSUER, audience: AUDIENCE })
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

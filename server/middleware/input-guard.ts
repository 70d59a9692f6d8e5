import type { NextFunction, Request, Response } from 'express'
import { CONTROL_MESSAGE, hasControl, hasControlInText, ID_MAX, lowerUuid } from '#shared/schemas/fields'
import { AppError, invalidInput } from '../errors.ts'

const SEGMENT_MESSAGE = `Each part of the address (such as a record id) is at most ${ID_MAX} characters, without control characters`
/** Deeper than any body the API takes (the exam record nests three levels). */
export const MAX_BODY_DEPTH = 32

const badPath = (message: string) => new AppError('invalid-path', 400, message, { path: message })

function decodeSegment(segment: string): string {
  try {
    return decodeURIComponent(segment)
  } catch {
    throw badPath('The address has a malformed percent-encoding')
  }
}

/** The API path with every segment checked, and UUIDs in lower case so `/exams/ABC…` names the record `abc…`. */
function checkedPath(path: string): string {
  return path
    .split('/')
    .map((raw) => {
      const segment = decodeSegment(raw)
      if (segment.length > ID_MAX || hasControl(segment)) throw badPath(SEGMENT_MESSAGE)
      return segment === raw ? lowerUuid(raw) : raw
    })
    .join('/')
}

/** Each query parameter with a control character in its name or values, as a field error keyed by the (cleaned) name. */
function queryFields(query: Record<string, unknown>): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const [key, value] of Object.entries(query)) {
    const values = Array.isArray(value) ? value : [value]
    const bad = hasControl(key) || values.some((v) => typeof v === 'string' && hasControl(v))
    if (bad) fields[key.replace(/[\u0000-\u001f\u007f]/g, '?') || '_'] = CONTROL_MESSAGE
  }
  return fields
}

/**
 * Path ids and query strings of `/api`, before any route sees them: a malformed percent-encoding, a control character
 * or an over-long path segment is a 400, never a lookup. UUID path segments are rewritten in lower case.
 */
export function pathAndQueryGuard(req: Request, _res: Response, next: NextFunction): void {
  // Express matches `/API/…` to the `/api` routes too (routing ignores case).
  if (!/^\/api(\/|$)/i.test(req.path)) return next()
  const path = checkedPath(req.path)
  const fields = queryFields(req.query as Record<string, unknown>)
  if (Object.keys(fields).length) throw invalidInput(fields)
  // An absolute-form target (`GET http://host/api/…`) keeps its spelling: the rewrite needs the path at the start.
  if (path !== req.path && req.url.startsWith(req.path)) req.url = path + req.url.slice(req.path.length)
  next()
}

type Pending = { value: unknown; path: string; depth: number }

const join = (path: string, key: string | number) => (path ? `${path}.${key}` : String(key))

/** Field errors for JSON text holding control characters (tab and line breaks allowed) or nesting too deep; walked without recursion. */
export function textFieldErrors(body: unknown): Record<string, string> {
  const fields: Record<string, string> = {}
  const stack: Pending[] = [{ value: body, path: '', depth: 0 }]
  while (stack.length) {
    const { value, path, depth } = stack.pop()!
    if (typeof value === 'string' && hasControlInText(value)) fields[path || '_'] ??= CONTROL_MESSAGE
    if (!value || typeof value !== 'object') continue
    if (depth >= MAX_BODY_DEPTH) {
      fields[path || '_'] ??= `Values nest at most ${MAX_BODY_DEPTH} levels deep`
      continue
    }
    for (const [key, child] of Object.entries(value)) {
      if (hasControl(key)) fields[path || '_'] ??= CONTROL_MESSAGE
      stack.push({ value: child, path: join(path, key), depth: depth + 1 })
    }
  }
  return fields
}

/**
 * JSON bodies: refused with 400 when any text holds a control character (NUL ends a statement in SQLite's parser) or
 * the value nests deeper than any request needs. `itemised` paths check each item themselves, so that one bad item
 * does not fail a batch.
 */
export function bodyGuard(itemised: readonly string[]) {
  const skip = new Set(itemised)
  return (req: Request, _res: Response, next: NextFunction): void => {
    if (skip.has(req.path.toLowerCase().replace(/\/+$/, '')) || req.body === undefined) return next()
    const fields = textFieldErrors(req.body)
    if (Object.keys(fields).length) throw invalidInput(fields)
    next()
  }
}

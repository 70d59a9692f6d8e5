import fc from 'fast-check'
import request from 'supertest'
import { expect } from 'vitest'
import { ApiErrorSchema } from '#shared/schemas/user'
import { ROLES, type FuzzApp, type FuzzRole } from './fuzz-app.ts'
import type { FuzzRoute } from './fuzz-routes.ts'
import { hostileString, hostileValue, pathId } from './hostile-values.ts'

/** Generated requests per route: `npm run fuzz` sets FUZZ_RUNS=1000; `npm test` runs a small sample. */
export const FUZZ_RUNS = Number(process.env.FUZZ_RUNS ?? 10)
/** Replays a failing run: fast-check prints the seed (and path) of every failure. */
export const FUZZ_SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : undefined
/** A request that takes longer has hung: superagent aborts it and the property fails. */
export const REQUEST_DEADLINE_MS = 2000
/** The ceiling for one route's whole property; only a hang of many requests reaches it. */
export const testTimeout = (runs: number) => Math.max(30_000, runs * REQUEST_DEADLINE_MS)

export interface FuzzRequest {
  role: FuzzRole
  method: FuzzRoute['method']
  url: string
  contentType?: string
  contentEncoding?: string
  body?: string
}

/** Percent-encodes UTF-8 bytes (lone surrogates become U+FFFD, as a browser would send them). */
export function encode(text: string): string {
  return [...Buffer.from(text, 'utf8')]
    .map((b) => (/[A-Za-z0-9_.~-]/.test(String.fromCharCode(b)) ? String.fromCharCode(b) : `%${b.toString(16).padStart(2, '0')}`))
    .join('')
}

/** Spellings Express routes alike: routing ignores case and a trailing slash. */
const SPELLINGS: ((path: string) => string)[] = [(p) => p, (p) => p.replace('/api', '/API'), (p) => `${p}/`, (p) => p.toUpperCase()]

/** The route's path with `:id` filled in, in any spelling that reaches the route. */
export const pathArb = (route: FuzzRoute, app: FuzzApp): fc.Arbitrary<string> => {
  const filled = route.path.includes(':id')
    ? pathId(app.realIds).map((id) => route.path.replace(':id', 'raw' in id ? id.raw : encode(id.text)))
    : fc.constant(route.path)
  return fc.tuple(filled, fc.nat({ max: 9 })).map(([path, pick]) => (pick < SPELLINGS.length ? SPELLINGS[pick]!(path) : path))
}

const QUERY_VALUES = [
  '1',
  '0',
  '200',
  '5000',
  'asc',
  'desc',
  'true',
  'csv',
  'draft',
  'submitted',
  'resident',
  'internal',
  '30-59',
  '2026-01-01T00:00:00Z',
]

/** A query string over the schema's parameters and unknown ones: hostile values, repeated keys, bad encodings. */
export const queryArb = (keys: readonly string[]): fc.Arbitrary<string> => {
  const key = keys.length ? fc.oneof({ arbitrary: fc.constantFrom(...keys), weight: 4 }, hostileString) : hostileString
  const value = fc.oneof(
    fc.constantFrom(...QUERY_VALUES),
    hostileString.map((v) => v.slice(0, 4000)),
  )
  const pair = fc.oneof(
    { arbitrary: fc.tuple(key, value).map(([k, v]) => `${encode(k)}=${encode(v)}`), weight: 6 },
    { arbitrary: fc.constantFrom('%ff=1', 'a=%ff', 'page=%00', '=', '&&', 'a[b]=1', 'a[__proto__][x]=1', 'constructor=x'), weight: 1 },
  )
  return fc.array(pair, { maxLength: 6 }).map((pairs) => (pairs.length ? `?${pairs.join('&')}` : ''))
}

/** A value at a path of the body, defined as an own property even for `__proto__`. */
function setAt(body: Record<string, unknown>, path: string[], value: unknown): Record<string, unknown> {
  const copy = structuredClone(body)
  let node: Record<string, unknown> = copy
  for (const key of path.slice(0, -1)) {
    const next = node[key]
    if (!next || typeof next !== 'object') break
    node = next as Record<string, unknown>
  }
  Object.defineProperty(node, path.at(-1)!, { value, enumerable: true, writable: true, configurable: true })
  return copy
}

/** Every key path of a body, nested objects and arrays included. */
function keyPaths(value: unknown, prefix: string[] = []): string[][] {
  if (!value || typeof value !== 'object') return []
  return Object.entries(value).flatMap(([k, v]) => [[...prefix, k], ...keyPaths(v, [...prefix, k])])
}

/** JSON text of a body: the valid example with one field made hostile, an unknown or prototype key added, or any value. */
export function jsonBodyArb(template: Record<string, unknown> | undefined): fc.Arbitrary<string> {
  const base = template ?? {}
  const paths = keyPaths(base)
  const options: fc.WeightedArbitrary<unknown>[] = [
    { arbitrary: hostileValue, weight: 1 },
    { arbitrary: fc.tuple(hostileString, hostileValue).map(([k, v]) => setAt(base, [k], v)), weight: 1 },
  ]
  if (paths.length)
    options.push({ arbitrary: fc.tuple(fc.constantFrom(...paths), hostileValue).map(([p, v]) => setAt(base, p, v)), weight: 3 })
  return fc.oneof(...options).map((body) => JSON.stringify(body) ?? 'null')
}

export const roleArb: fc.Arbitrary<FuzzRole> = fc.constantFrom(...ROLES)

/** Sends one generated request; a request that does not finish within the deadline rejects. */
export async function send(app: FuzzApp, req: FuzzRequest): Promise<request.Response> {
  let call = request(app.server)[req.method](req.url).timeout({ deadline: REQUEST_DEADLINE_MS })
  const auth = app.authOf(req.role)
  if (auth) call = call.set('Authorization', auth)
  if (req.contentType !== undefined) call = call.set('Content-Type', req.contentType)
  if (req.contentEncoding) call = call.set('Content-Encoding', req.contentEncoding)
  return req.body === undefined ? call : call.send(req.body)
}

/** The requirement every answer meets: never a 5xx, and every error in the one error shape. */
export function expectHandled(res: request.Response): void {
  expect(res.status).toBeLessThan(500)
  // 431 comes from Node's HTTP parser (headers over 16 kB), before the app.
  if (res.status >= 400 && res.status !== 431) expect(ApiErrorSchema.safeParse(res.body).success, JSON.stringify(res.body)).toBe(true)
}

/** One route's property over `runs` generated requests, then a health check: the server still answers. */
export async function fuzzRoute(app: FuzzApp, requests: fc.Arbitrary<FuzzRequest>, runs = FUZZ_RUNS): Promise<void> {
  await fc.assert(
    fc.asyncProperty(requests, async (req) => expectHandled(await send(app, req))),
    { numRuns: runs, seed: FUZZ_SEED, endOnFailure: true },
  )
  expect((await request(app.server).get('/api/health').timeout({ deadline: REQUEST_DEADLINE_MS })).status).toBe(200)
}

import fc from 'fast-check'
import { afterAll, beforeAll, describe, it } from 'vitest'
import { fuzzApp, type FuzzApp } from './fuzz-app.ts'
import { fuzzRoute, jsonBodyArb, pathArb, roleArb, testTimeout, FUZZ_RUNS, type FuzzRequest } from './fuzz-requests.ts'
import { FUZZ_ROUTES, routeName, type FuzzRoute } from './fuzz-routes.ts'
import { hostileString } from './hostile-values.ts'

let app: FuzzApp

beforeAll(async () => {
  app = await fuzzApp()
})

afterAll(() => app.close())

const CONTENT_TYPES = [
  'application/json',
  'application/json; charset=utf-8',
  'application/json; charset=bogus',
  'application/json; charset=utf-16',
  'application/json; charset=latin1',
  'application/merge-patch+json',
  'text/plain',
  'application/x-www-form-urlencoded',
  'multipart/form-data',
  'multipart/form-data; boundary=fuzz',
  'application/octet-stream',
  'image/png',
  '',
  '*/*',
  'application/json; boundary=',
]

const ENCODINGS = [undefined, 'gzip', 'deflate', 'br', 'identity', 'bogus', 'gzip, gzip']

/** A multipart body for boundary `fuzz`: parts with hostile names, file names and values, sometimes cut off before the end. */
const multipartArb: fc.Arbitrary<string> = fc
  .tuple(fc.array(fc.tuple(hostileString, hostileString, fc.boolean()), { maxLength: 4 }), fc.boolean())
  .map(([parts, closed]) => {
    const text = parts
      .map(([name, value, isFile]) => {
        const file = isFile ? `; filename="${name.slice(0, 100)}"\r\nContent-Type: image/png` : ''
        return `--fuzz\r\nContent-Disposition: form-data; name="${isFile ? 'file' : name.slice(0, 100)}"${file}\r\n\r\n${value.slice(0, 5000)}\r\n`
      })
      .join('')
    return closed ? `${text}--fuzz--\r\n` : text
  })

/** Any body under any declared content type and encoding, truncated forms included. */
const transportRequest = (route: FuzzRoute): fc.Arbitrary<FuzzRequest> =>
  fc.record({
    role: roleArb,
    method: fc.constant(route.method),
    url: pathArb(route, app),
    contentType: fc.constantFrom(...CONTENT_TYPES),
    contentEncoding: fc.constantFrom(...ENCODINGS),
    body: fc.oneof(jsonBodyArb(app.templates[routeName(route)]), multipartArb, hostileString),
  })

describe('every route that reads a body, under odd content types and encodings', () => {
  for (const route of FUZZ_ROUTES.filter((r) => r.body || r.multipart)) {
    it(`${routeName(route)}: any body, type and encoding never answers 5xx or hangs`, { timeout: testTimeout(FUZZ_RUNS) }, () =>
      fuzzRoute(app, transportRequest(route)),
    )
  }
})

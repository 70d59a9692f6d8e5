import fc from 'fast-check'
import { afterAll, beforeAll, describe, it } from 'vitest'
import { fuzzApp, type FuzzApp } from './fuzz-app.ts'
import { fuzzRoute, jsonBodyArb, pathArb, roleArb, testTimeout, FUZZ_RUNS, type FuzzRequest } from './fuzz-requests.ts'
import { FUZZ_ROUTES, routeName, type FuzzRoute } from './fuzz-routes.ts'

let app: FuzzApp

beforeAll(async () => {
  app = await fuzzApp()
})

afterAll(() => app.close())

/** JSON bodies: the route's valid example with a field made hostile, prototype keys, huge and deep values; as every role. */
const jsonRequest = (route: FuzzRoute): fc.Arbitrary<FuzzRequest> =>
  fc.record({
    role: roleArb,
    method: fc.constant(route.method),
    url: pathArb(route, app),
    contentType: fc.constant('application/json'),
    body: jsonBodyArb(app.templates[routeName(route)]),
  })

describe('every JSON route, fuzzed', () => {
  for (const route of FUZZ_ROUTES.filter((r) => r.body)) {
    it(`${routeName(route)}: any JSON body, as any role, never answers 5xx or hangs`, { timeout: testTimeout(FUZZ_RUNS) }, () =>
      fuzzRoute(app, jsonRequest(route)),
    )
  }
})

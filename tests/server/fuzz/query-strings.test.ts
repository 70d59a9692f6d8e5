import fc from 'fast-check'
import { afterAll, beforeAll, describe, it } from 'vitest'
import { fuzzApp, type FuzzApp } from './fuzz-app.ts'
import { fuzzRoute, pathArb, queryArb, roleArb, testTimeout, FUZZ_RUNS, type FuzzRequest } from './fuzz-requests.ts'
import { FUZZ_ROUTES, routeName, type FuzzRoute } from './fuzz-routes.ts'

let app: FuzzApp

beforeAll(async () => {
  app = await fuzzApp()
})

afterAll(() => app.close())

/** Path ids and query strings: hostile values, unknown and repeated keys, bad percent-encoding; as every role. */
const queryRequest = (route: FuzzRoute): fc.Arbitrary<FuzzRequest> =>
  fc.record({
    role: roleArb,
    method: fc.constant(route.method),
    url: fc.tuple(pathArb(route, app), queryArb(route.query ?? [])).map(([path, query]) => path + query),
  })

describe('every route’s path and query string, fuzzed', () => {
  for (const route of FUZZ_ROUTES.filter((r) => r.method === 'get' || r.path.includes(':id'))) {
    it(`${routeName(route)}: any id and query string, as any role, never answers 5xx or hangs`, { timeout: testTimeout(FUZZ_RUNS) }, () =>
      fuzzRoute(app, queryRequest(route)),
    )
  }
})

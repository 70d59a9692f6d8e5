import type { Options } from 'express-rate-limit'
import { pino } from 'pino'
import { QueryTypes, type Sequelize } from 'sequelize'
import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { afterResponseIdle } from '../../../server/accounts/background.ts'
import { createApp } from '../../../server/app.ts'
import { ATTEMPT_WINDOW_MS } from '../../../server/middleware/rate-limit.ts'
import { DatabaseStore, PRUNE_EVERY_MS } from '../../../server/middleware/rate-limit-store.ts'
import { makeUser, openTestDatabaseWithModels, TEST_SECRET } from '../helpers.ts'

let db: Awaited<ReturnType<typeof openTestDatabaseWithModels>>

beforeEach(async () => {
  db = await openTestDatabaseWithModels()
})

/** An app server on the shared database: its own limiters, as a second process would build them. */
const appServer = () =>
  createApp({
    ...db,
    secret: TEST_SECRET,
    log: pino({ level: 'silent' }),
    demo: false,
    cookieSecure: false,
    loginAttempts: 3,
    baseUrl: 'https://plumbline.test',
  })

/** A store on a clock the test moves. */
function storeAt(start: number) {
  const clock = { now: start }
  const store = new DatabaseStore(() => clock.now)
  store.init({ windowMs: ATTEMPT_WINDOW_MS } as Options)
  return { store, clock }
}

const storedRows = (sequelize: Sequelize) =>
  sequelize.query<{ key: string; hits: number }>('SELECT "key", "hits" FROM "rate_limit_hits"', { type: QueryTypes.SELECT })

describe('sign-in attempts across app servers', () => {
  it('when failures go to two servers on one database, the limit counts them together and answers 429', async () => {
    await makeUser({ email: 'shared@example.test' })
    const [one, two] = [appServer(), appServer()]
    const attempt = (app: typeof one) => request(app).post('/api/auth/login').send({ email: 'shared@example.test', password: 'wrong' })

    const statuses = [(await attempt(one)).status, (await attempt(two)).status, (await attempt(one)).status, (await attempt(two)).status]

    expect(statuses).toEqual([401, 401, 401, 429])
  })

  it('counts each route on its own: failed sign-ins do not use up password-reset requests for the same e-mail', async () => {
    const [one, two] = [appServer(), appServer()]
    for (let i = 0; i < 6; i++) await request(one).post('/api/auth/login').send({ email: 'x@example.test', password: 'wrong' })

    const res = await request(two).post('/api/auth/password-reset').send({ email: 'x@example.test' })
    await afterResponseIdle()

    expect(res.status).toBe(202)
  })
})

describe('DatabaseStore', () => {
  it('counts hits of one key within the window and starts again at one once it has ended', async () => {
    const { store, clock } = storeAt(1_000_000)

    const first = await store.increment('k')
    const second = await store.increment('k')
    clock.now += ATTEMPT_WINDOW_MS
    const afterWindow = await store.increment('k')

    expect([first.totalHits, second.totalHits, afterWindow.totalHits]).toEqual([1, 2, 1])
    expect(second.resetTime).toEqual(new Date(1_000_000 + ATTEMPT_WINDOW_MS))
    expect(afterWindow.resetTime).toEqual(new Date(1_000_000 + 2 * ATTEMPT_WINDOW_MS))
  })

  it('two stores on one database read and change the same count', async () => {
    const a = storeAt(5_000).store
    const b = storeAt(5_000).store

    await a.increment('k')
    await b.increment('k')
    await a.decrement('k')

    expect((await b.get('k'))?.totalHits).toBe(1)
    await b.resetKey('k')
    expect(await a.get('k')).toBeUndefined()
  })

  it('keeps no client address or e-mail in the table', async () => {
    const { store } = storeAt(5_000)

    await store.increment('/api/auth/login|192.0.2.1|someone@example.test')

    const rows = await storedRows(db.sequelize)
    expect(rows).toHaveLength(1)
    expect(rows[0]!.key).toMatch(/^[0-9a-f]{64}$/)
  })

  it('deletes ended windows when it next counts, after the pruning interval', async () => {
    const { store, clock } = storeAt(10_000)
    await store.increment('old')
    clock.now += ATTEMPT_WINDOW_MS + PRUNE_EVERY_MS

    await store.increment('new')

    expect((await storedRows(db.sequelize)).map((r) => r.hits)).toEqual([1])
    expect(await store.get('old')).toBeUndefined()
  })
})

import { randomUUID } from 'node:crypto'
import bcrypt from 'bcryptjs'
import { pino } from 'pino'
import request from 'supertest'
import type { Role } from '#shared/schemas/user'
import { createApp, type AppDeps } from '../../server/app.ts'
import { BCRYPT_COST } from '../../server/auth/passwords.ts'
import { signAccessToken } from '../../server/auth/tokens.ts'
import { createMigrator } from '../../server/db/migrator.ts'
import { openDatabase } from '../../server/db/sequelize.ts'
import { initModels, MembershipModel, TeamModel, UserModel } from '../../server/models/index.ts'

export const TEST_SECRET = 'test-secret-'.padEnd(64, 'x')
export const PASSWORD = 'correct-horse-battery'
// Hashed once per file: each bcrypt hash at the production cost takes a few hundred milliseconds.
let passwordHash: string | undefined

/** A fresh in-memory database, migrated, and the app built on it. */
export async function makeTestApp(overrides: Partial<AppDeps> = {}) {
  const sequelize = openDatabase(':memory:')
  const models = initModels(sequelize)
  await createMigrator(sequelize).up()
  const app = createApp({
    sequelize,
    models,
    secret: TEST_SECRET,
    log: pino({ level: 'silent' }),
    demo: false,
    cookieSecure: false,
    ...overrides,
    baseUrl: overrides.baseUrl ?? 'https://plumbline.test',
  })
  return { app, sequelize }
}

export async function makeTeam(name = `Team ${randomUUID().slice(0, 8)}`) {
  return TeamModel.create({ id: randomUUID(), name })
}

export interface UserOptions {
  roles?: Role[]
  teamIds?: string[]
  email?: string
  displayName?: string
  active?: boolean
  /** False leaves the account without a password, sparing a bcrypt hash where no test signs in. */
  withPassword?: boolean
}

export async function makeUser(opts: UserOptions = {}) {
  if (opts.withPassword !== false) passwordHash ??= await bcrypt.hash(PASSWORD, BCRYPT_COST)
  const user = await UserModel.create({
    id: randomUUID(),
    email: opts.email ?? `${randomUUID().slice(0, 8)}@example.test`,
    displayName: opts.displayName ?? 'Test Person',
    passwordHash: opts.withPassword === false ? null : passwordHash!,
    roles: opts.roles ?? ['resident'],
    active: opts.active ?? true,
  })
  await MembershipModel.bulkCreate((opts.teamIds ?? []).map((teamId) => ({ userId: user.id, teamId })))
  return user
}

export async function signIn(app: Parameters<typeof request>[0], email: string, password = PASSWORD) {
  const res = await request(app).post('/api/auth/login').send({ email, password })
  return { res, token: res.body.token as string, cookie: res.headers['set-cookie'] as unknown as string[] }
}

/** A user and the `Authorization` header of a session of theirs, minted directly: sign-in itself is tested in auth.api.test.ts. */
export async function makeCaller(opts: UserOptions = {}) {
  const user = await makeUser({ withPassword: false, ...opts })
  const token = signAccessToken(TEST_SECRET, { sub: user.id, roles: opts.roles ?? ['resident'] })
  return { user, auth: `Bearer ${token}` }
}

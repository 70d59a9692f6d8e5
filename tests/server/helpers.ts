import { randomUUID } from 'node:crypto'
import { copyFileSync } from 'node:fs'
import path from 'node:path'
import bcrypt from 'bcryptjs'
import { pino } from 'pino'
import type { Database } from 'sqlite3'
import type { Sequelize } from 'sequelize'
import request from 'supertest'
import { inject } from 'vitest'
import type { Role } from '#shared/schemas/user'
import { createApp, type AppDeps } from '../../server/app.ts'
import { BCRYPT_COST } from '../../server/auth/passwords.ts'
import { signAccessToken } from '../../server/auth/tokens.ts'
import { createMigrator } from '../../server/db/migrator.ts'
import { openDatabase } from '../../server/db/sequelize.ts'
import { initModels, MembershipModel, TeamModel, UserModel } from '../../server/models/index.ts'
import { isPostgres, POSTGRES_TEMPLATE } from './database-kind.ts'
import { createPostgresDatabase, freshFileDatabase } from './postgres-databases.ts'

declare module 'vitest' {
  export interface ProvidedContext {
    /** A SQLite file with every migration applied (tests/server/template-database.ts), copied into each test's database. */
    templateDatabase: string
    /** `postgres://user@host:port` of the server-pg project's cluster (tests/server/postgres-cluster.ts). */
    postgresServer: string
  }
}

export const TEST_SECRET = 'test-secret-'.padEnd(64, 'x')
export const PASSWORD = 'correct-horse-battery'
// Hashed once per file, even at the test runner's low work factor.
let passwordHash: string | undefined

/** Copies the migrated template (tests/server/template-database.ts) into the in-memory database; sqlite3's online backup API. */
function restoreTemplate(sequelize: Sequelize, template: string): Promise<void> {
  const connections = sequelize.connectionManager as unknown as { getConnection(options: object): Promise<Database & BackupApi> }
  return connections.getConnection({}).then(
    (db) =>
      new Promise((resolve, reject) => {
        const backup = db.backup(template, 'main', 'main', false, (err) => err && reject(err))
        backup.step(-1, (err) => (backup.finish(), err ? reject(err) : resolve()))
      }),
  )
}

type Done = (err: Error | null) => void

/** node-sqlite3's Database#backup, which its type declarations leave out; `fileIsDestination: false` restores from the file. */
interface BackupApi {
  backup(file: string, destName: string, sourceName: string, fileIsDestination: boolean, done: Done): Backup
}

interface Backup {
  step(pages: number, done: Done): void
  finish(): void
}

/** A fresh database with every migration applied: SQLite in memory, or on PostgreSQL a copy of the run's template. */
async function openMigrated(): Promise<Sequelize> {
  if (isPostgres) {
    const own = await freshFileDatabase()
    const sequelize = openDatabase(own.url)
    own.opened.push(sequelize)
    return sequelize
  }
  const sequelize = openDatabase(':memory:')
  const template = inject('templateDatabase')
  if (template) await restoreTemplate(sequelize, template)
  else await createMigrator(sequelize).up()
  return sequelize
}

/** A fresh database with every migration applied (from the run's template when there is one) and its models. */
export async function openTestDatabaseWithModels() {
  const sequelize = await openMigrated()
  return { sequelize, models: initModels(sequelize) }
}

/** An empty database, for tests that migrate it step by step: SQLite in memory, or a new PostgreSQL database. */
export async function openBlankDatabase(): Promise<Sequelize> {
  return openDatabase(isPostgres ? await createPostgresDatabase('template0') : ':memory:')
}

/**
 * Where a second connection can open the same migrated database: a copy of the template as a SQLite file in `dir`, or
 * the URL of a new PostgreSQL database (`dir` unused). For tests of several connections or servers on one database.
 */
export async function sharedTestDatabase(dir: string): Promise<string> {
  if (isPostgres) return createPostgresDatabase(POSTGRES_TEMPLATE)
  const file = path.join(dir, 'plumbline.sqlite')
  copyFileSync(inject('templateDatabase'), file)
  return file
}

/** A fresh database with every migration applied, from the run's template when there is one. */
export async function openTestDatabase(): Promise<Sequelize> {
  return (await openTestDatabaseWithModels()).sequelize
}

/** A fresh database, migrated, and the app built on it. */
export async function makeTestApp(overrides: Partial<AppDeps> = {}) {
  const { sequelize, models } = await openTestDatabaseWithModels()
  const app = createApp({
    sequelize,
    models,
    secret: TEST_SECRET,
    // TEST_LOG_LEVEL=error shows what a 500 hides.
    log: pino({ level: process.env.TEST_LOG_LEVEL ?? 'silent' }),
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

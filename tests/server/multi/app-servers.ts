import { mkdtempSync, rmSync } from 'node:fs'
import { once } from 'node:events'
import { createServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { pino } from 'pino'
import { vi } from 'vitest'
import { sharedTestDatabase, TEST_SECRET } from '../helpers.ts'

/**
 * Where the app servers of a test meet: in the `server-pg` project a new database on the run's PostgreSQL cluster; in
 * the `server` project a copy of the run's migrated template as a SQLite file in `dir`, which the servers open in WAL
 * mode, as two processes on one machine would.
 */
export async function sharedDatabase(dir: string): Promise<string> {
  return sharedTestDatabase(dir)
}

/** A temp folder for the shared database, removed by the returned function. */
export function tempFolder(): { dir: string; remove: () => void } {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-multi-'))
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) }
}

export type AppServer = Awaited<ReturnType<typeof startAppServer>>

/**
 * An app server as a process of its own has it, listening on a loopback port: its own copy of the server's modules
 * (models, settings and error-term caches, rate limiters, write queue) and its own connection to `location`.
 */
export async function startAppServer(location: string) {
  vi.resetModules()
  const { createApp } = await import('../../../server/app.ts')
  const { closePasswordHashing } = await import('../../../server/auth/passwords.ts')
  const { createMigrator } = await import('../../../server/db/migrator.ts')
  const { openDatabase } = await import('../../../server/db/sequelize.ts')
  const { initModels } = await import('../../../server/models/index.ts')
  const sequelize = openDatabase(location)
  // Nothing is pending on the template's copy; a database named by TEST_DATABASE_URL is brought up to date.
  await createMigrator(sequelize).up()
  const models = initModels(sequelize)
  const log = pino({ level: 'silent' })
  const app = createApp({
    sequelize,
    models,
    secret: TEST_SECRET,
    log,
    demo: false,
    cookieSecure: false,
    baseUrl: 'https://plumbline.test',
  })
  const server = createServer(app).listen(0, '127.0.0.1')
  await once(server, 'listening')
  const close = async () => {
    server.closeAllConnections()
    await new Promise((resolve) => server.close(resolve))
    await closePasswordHashing()
    await sequelize.close()
  }
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, models, close }
}

import { mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { pino } from 'pino'
import { createApp } from '../../../server/app.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { initModels } from '../../../server/models/index.ts'
import { sharedTestDatabase, TEST_SECRET } from '../helpers.ts'

/**
 * The app over HTTP on a free loopback port, on a database file in a temp folder (a copy of the run's migrated
 * template; on PostgreSQL a database of its own): unlike the in-memory databases of the other API tests, each transaction gets a connection of its own,
 * as in production.
 */
export async function startFileServer() {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-file-server-'))
  const file = await sharedTestDatabase(dir)
  const sequelize = openDatabase(file)
  const log = pino({ level: 'silent' })
  const app = createApp({
    sequelize,
    models: initModels(sequelize),
    secret: TEST_SECRET,
    log,
    demo: false,
    cookieSecure: false,
    baseUrl: 'https://plumbline.test',
  })
  const server = createServer(app).listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  let closed = false
  const close = async () => {
    if (closed) return
    closed = true
    server.closeAllConnections()
    await new Promise((resolve) => server.close(resolve))
    await sequelize.close()
  }
  return {
    url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    dir,
    file,
    sequelize,
    /** Stops serving and closes the database; the folder stays for the test to read. */
    close,
    /** Closes, then removes the folder. */
    remove: async () => (await close(), rmSync(dir, { recursive: true, force: true })),
  }
}

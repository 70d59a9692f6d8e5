import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { createServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { observerTerm } from './agreement/observer-term.ts'
import { createApp } from './app.ts'
import { loadConfig, type Config } from './config.ts'
import { createMigrator } from './db/migrator.ts'
import { databaseLocation, isSqlite, journalMode, openDatabase } from './db/sequelize.ts'
import { seedDemo } from './demo/seed.ts'
import { createLogger } from './logger.ts'
import { startFakeSmtp } from './mail/fake-smtp.ts'
import { createMailer } from './mail/mailer.ts'
import { initModels } from './models/index.ts'
import { shutDown } from './shutdown.ts'

/** The folder holding package.json: the repository, or where a production build was copied and installed. */
function packageRoot(dir = path.dirname(fileURLToPath(import.meta.url))): string {
  if (existsSync(path.join(dir, 'package.json')) || path.dirname(dir) === dir) return dir
  return packageRoot(path.dirname(dir))
}

function jwtSecret(config: Config): string {
  if (config.JWT_SECRET) return config.JWT_SECRET
  const file = path.join(config.DATA_DIR, 'jwt-secret')
  if (!existsSync(file)) writeFileSync(file, randomBytes(48).toString('hex'), { mode: 0o600 })
  return readFileSync(file, 'utf8').trim()
}

export interface RunningServer {
  url: string
  close(): Promise<void>
}

/** Opens the database, migrates, seeds in demo mode and listens; used by `npm start` and the browser tests. */
export async function startServer(config: Config): Promise<RunningServer> {
  const log = createLogger(config.LOG_LEVEL)
  mkdirSync(config.DATA_DIR, { recursive: true })
  const sequelize = openDatabase(databaseLocation(config))
  await sequelize.authenticate()
  // SQLite: writers queue and readers go on beside them only in WAL (db/sqlite-connection.ts); another process holding
  // the file as it is first switched would leave it in its old mode.
  if (isSqlite(sequelize) && (await journalMode(sequelize)) !== 'wal') {
    throw new Error('The database is not in WAL mode; is another process holding it?')
  }
  const models = initModels(sequelize)
  await createMigrator(sequelize).up()
  if (config.DEMO) await seedDemo()
  // Demo: a local SMTP catcher on an ephemeral loopback port, so two instances (or e2e runs) never clash.
  const fakeSmtp = config.DEMO ? await startFakeSmtp({ host: '127.0.0.1', port: 0 }) : undefined
  const mailer = createMailer({
    host: fakeSmtp ? '127.0.0.1' : config.SMTP_HOST,
    port: fakeSmtp?.port ?? config.SMTP_PORT,
    from: config.SMTP_FROM,
    log,
    auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASS ?? '' } : undefined,
  })
  // Listen first, so the address e-mail links fall back to is known (the port may be chosen by the system).
  const server = createServer()
  server.listen(config.PORT, config.HOST)
  await new Promise<void>((resolve, reject) => server.once('listening', resolve).once('error', reject))
  const { port } = server.address() as AddressInfo
  const url = `http://${config.HOST === '127.0.0.1' ? 'localhost' : config.HOST}:${port}`
  // Links in e-mails never come from a request's Host header, which a caller controls (a reset link could be
  // pointed at another site); without PUBLIC_URL they point at the address the server listens on.
  if (!config.PUBLIC_URL && !config.DEMO) log.warn({ url }, 'PUBLIC_URL is not set; links in e-mails point at the listening address')
  const app = createApp({
    sequelize,
    models,
    secret: jwtSecret(config),
    log,
    demo: config.DEMO,
    cookieSecure: config.COOKIE_SECURE,
    // The same folder whether this runs from source (tsx) or as the bundle in dist/server.
    clientDir: path.join(packageRoot(), 'dist', 'client'),
    mailer,
    mailbox: fakeSmtp,
    baseUrl: config.PUBLIC_URL ?? url,
    attachmentsDir: config.UPLOADS_DIR ?? path.join(config.DATA_DIR, 'attachments'),
  })
  server.on('request', app)
  // Computes the local error term once now, so the first save does not pay for it.
  void observerTerm().catch((err: unknown) => log.warn({ err }, 'could not compute the local error term'))
  return {
    url,
    close: () => shutDown({ server, graceMs: config.SHUTDOWN_GRACE_MS, mailer, fakeSmtp, sequelize }),
  }
}

/** Entry point of `npm run serve` (the bundle in dist/server) and `tsx server/index.ts`. */
export async function main() {
  const running = await startServer(loadConfig())
  console.log(`Plumbline is running at ${running.url}`)
  // Requests in flight finish, then the database closes; a second signal stops at once.
  let stopping = false
  const stop = async (signal: NodeJS.Signals) => {
    if (stopping) process.exit(1)
    stopping = true
    console.log(`${signal}: finishing the requests in flight`)
    await running.close()
    process.exit(0)
  }
  process.on('SIGTERM', stop)
  process.on('SIGINT', stop)
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) await main()

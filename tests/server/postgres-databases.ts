import { randomBytes } from 'node:crypto'
import pg from 'pg'
import type { Sequelize } from 'sequelize'
import { inject } from 'vitest'
import { POSTGRES_TEMPLATE } from './database-kind.ts'

// The databases a test file made on the server-pg project's cluster, dropped when the file ends (file-databases.ts).
// Kept on globalThis, so that a second copy of this module (a file that resets modules) sees the same list.
interface FileState {
  admin?: pg.Client
  names: string[]
  /** The file's migrated database, its rows as the template has them, and a connection that puts them back. */
  own?: { url: string; reset: string; client: pg.Client; opened: Sequelize[] }
}
const KEY = Symbol.for('plumbline.test.postgresDatabases')
const state = () => ((globalThis as { [KEY]?: FileState })[KEY] ??= { names: [] })

async function connect(database: string): Promise<pg.Client> {
  const client = new pg.Client({ connectionString: `${inject('postgresServer')}/${database}` })
  await client.connect()
  return client
}

/** A new database copied from `template` (the migrated one, or template0 for an empty one); answers its URL. */
export async function createPostgresDatabase(template: string): Promise<string> {
  const file = state()
  const name = `test_${process.pid}_${randomBytes(6).toString('hex')}`
  file.admin ??= await connect('postgres')
  await file.admin.query(`CREATE DATABASE "${name}" TEMPLATE "${template}"`)
  file.names.push(name)
  return `${inject('postgresServer')}/${name}`
}

const literal = (text: string) => `'${text.replaceAll("'", "''")}'`

/**
 * One statement that empties every table and puts back the template's rows (settings version 1, the sync counter…),
 * with triggers off (`session_replication_role = replica`: the append-only triggers would refuse the DELETEs), and
 * restarts the id sequences.
 */
async function resetStatement(client: pg.Client): Promise<string> {
  const tables = await client.query<{ name: string }>(
    `SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'SequelizeMeta'`,
  )
  const statements = ['SET session_replication_role = replica']
  for (const { name } of tables.rows) statements.push(`DELETE FROM "${name}"`)
  for (const { name } of tables.rows) {
    const rows = (await client.query(`SELECT * FROM "${name}"`)).rows
    if (rows.length)
      statements.push(`INSERT INTO "${name}" SELECT * FROM json_populate_recordset(NULL::"${name}", ${literal(JSON.stringify(rows))})`)
  }
  const sequences = await client.query<{ name: string }>(`SELECT sequencename AS name FROM pg_sequences WHERE schemaname = 'public'`)
  for (const { name } of sequences.rows) statements.push(`ALTER SEQUENCE "${name}" RESTART`)
  statements.push('SET session_replication_role = DEFAULT')
  return statements.join(';\n')
}

/**
 * The test file's migrated database as the template left it; answers its URL. Made once per file (a copy of the
 * template costs a few hundred ms on a busy machine), then emptied and filled again for each test, which costs a few
 * ms. The databases opened on it before are closed: one test's database does not outlive the next test's.
 */
export async function freshFileDatabase(): Promise<{ url: string; opened: Sequelize[] }> {
  const file = state()
  if (!file.own) {
    const url = await createPostgresDatabase(POSTGRES_TEMPLATE)
    const client = await connect(url.slice(url.lastIndexOf('/') + 1))
    file.own = { url, client, reset: await resetStatement(client), opened: [] }
    return file.own
  }
  await Promise.all(file.own.opened.splice(0).map((db) => db.close().catch(() => undefined)))
  await file.own.client.query(file.own.reset)
  return file.own
}

/** Closes what the file left open and drops its databases (WITH (FORCE) cuts any connection still open, PG 13+). */
export async function dropPostgresDatabases(): Promise<void> {
  const file = state()
  if (file.own) {
    await Promise.all(file.own.opened.map((db) => db.close().catch(() => undefined)))
    await file.own.client.end()
    file.own = undefined
  }
  if (!file.admin) return
  for (const name of file.names.splice(0)) await file.admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`)
  await file.admin.end()
  file.admin = undefined
}

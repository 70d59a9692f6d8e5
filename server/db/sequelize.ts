import path from 'node:path'
import pg from 'pg'
import { QueryTypes, Sequelize } from 'sequelize'
import { serverSqlite3 } from './sqlite-connection.ts'
import { holdsWriteTurn, inWriteTurn } from './write-queue.ts'

/** The database file the server keeps in its data folder. */
export const databaseFile = (dataDir: string) => path.join(dataDir, 'plumbline.sqlite')

const POSTGRES_URL = /^postgres(?:ql)?:\/\//

/** Where the server's data lives: `DATABASE_URL` (PostgreSQL) when set, else the SQLite file in `DATA_DIR`. */
export function databaseLocation(config: { DATABASE_URL?: string | undefined; DATA_DIR: string }): string {
  return config.DATABASE_URL ?? databaseFile(config.DATA_DIR)
}

/** Whether `location` names a PostgreSQL database rather than a SQLite file. */
export const isPostgresUrl = (location: string) => POSTGRES_URL.test(location)

/** Whether the database is SQLite (one writer at a time, a file that `npm run backup` can copy). */
export const isSqlite = (sequelize: Sequelize) => sequelize.getDialect() === 'sqlite'

// COUNT(*) and other bigint results arrive from pg as text, as they may exceed 2^53; every bigint this app reads (counts,
// the sync cursor, ids) stays far below it, so it is read as a number, as SQLite gives it.
pg.types.setTypeParser(pg.types.builtins.INT8, (value: string) => Number.parseInt(value, 10))

/**
 * Opens the database through Sequelize: a `postgres://` URL, else a SQLite file path or ':memory:'. The one place that
 * knows which database is in use. Every SQLite connection gets WAL, the busy timeout and `synchronous`
 * (sqlite-connection.ts), and its statements that write outside a transaction wait their turn (write-queue.ts);
 * PostgreSQL runs such statements at once, as it locks rows (write transactions: transaction.ts).
 */
export function openDatabase(location: string): Sequelize {
  if (isPostgresUrl(location)) return new Sequelize(location, { dialect: 'postgres', dialectModule: pg, logging: false })
  const sequelize = new Sequelize({ dialect: 'sqlite', dialectModule: serverSqlite3, storage: location, logging: false })
  queueStatementsThatWrite(sequelize)
  return sequelize
}

const WRITE = /^\s*(INSERT|UPDATE|DELETE|REPLACE)\b/i

/**
 * A write outside any transaction (e.g. `Model.create(values)` with no `transaction`) is one auto-committed statement
 * on the shared connection; it waits its turn behind the write transactions like they do, instead of holding that
 * connection, and every read queued on it, in SQLite's busy handler. Inside a write turn it runs at once (it would
 * otherwise wait for the turn it is part of).
 */
function queueStatementsThatWrite(sequelize: Sequelize): void {
  const query = sequelize.query.bind(sequelize) as (
    sql: string | { query: string },
    options?: { transaction?: unknown },
  ) => Promise<unknown>
  const queued: typeof query = (sql, options) => {
    const text = typeof sql === 'string' ? sql : sql.query
    if (options?.transaction || !WRITE.test(text) || holdsWriteTurn(sequelize)) return query(sql, options)
    return inWriteTurn(sequelize, () => query(sql, options))
  }
  sequelize.query = queued as typeof sequelize.query
}

/** The journal mode SQLite reports: `wal` for a server's file, `memory` for an in-memory database. */
export async function journalMode(sequelize: Sequelize): Promise<string> {
  const [row] = await sequelize.query<{ journal_mode: string }>('PRAGMA journal_mode', { type: QueryTypes.SELECT })
  return row?.journal_mode ?? 'unknown'
}

import path from 'node:path'
import { QueryTypes, Sequelize } from 'sequelize'
import { serverSqlite3 } from './sqlite-connection.ts'
import { holdsWriteTurn, inWriteTurn } from './write-queue.ts'

/** The database file the server keeps in its data folder. */
export const databaseFile = (dataDir: string) => path.join(dataDir, 'plumbline.sqlite')

/**
 * Opens SQLite through Sequelize: `storage` is a file path or ':memory:'. Every connection gets WAL, the busy timeout
 * and `synchronous` (sqlite-connection.ts). The one place that knows the database is SQLite; PostgreSQL would be opened
 * here from a URL, without the write queue of statements below (write-queue.ts skips dialects that lock rows).
 */
export function openDatabase(storage: string): Sequelize {
  const sequelize = new Sequelize({ dialect: 'sqlite', dialectModule: serverSqlite3, storage, logging: false })
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

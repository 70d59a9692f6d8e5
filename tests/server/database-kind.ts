// Which database the server tests run on: the `server` project on SQLite, `server-pg` on PostgreSQL (vite.config.ts
// sets TEST_DATABASE there). A test about SQLite itself (PRAGMAs, WAL, its files) runs under `describe.runIf(isSqlite)`.
export const testDatabase: 'sqlite' | 'postgres' = process.env.TEST_DATABASE === 'postgres' ? 'postgres' : 'sqlite'
export const isSqlite = testDatabase === 'sqlite'
export const isPostgres = testDatabase === 'postgres'

/** The migrated database of the PostgreSQL run, copied into every test's database. */
export const POSTGRES_TEMPLATE = 'plumbline_template'

import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import pg from 'pg'
import sqlite3 from 'sqlite3'
import { isPostgresUrl, openDatabase } from '../../../server/db/sequelize.ts'
import { initModels } from '../../../server/models/index.ts'
import { isPostgres } from '../database-kind.ts'
import { sharedTestDatabase } from '../helpers.ts'

/** A migrated database of its own (a file, as on a server, or a PostgreSQL database), with the models bound to it. */
export async function fileDatabase() {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-chain-'))
  const file = await sharedTestDatabase(dir)
  const sequelize = openDatabase(file)
  initModels(sequelize)
  const cleanup = async () => {
    await sequelize.close()
    rmSync(dir, { recursive: true, force: true })
  }
  return { dir, file, sequelize, cleanup }
}

/** The statement dropping one of audit_events' triggers, as the database in use spells it. */
export const dropTrigger = (name: string) => (isPostgres ? `DROP TRIGGER ${name} ON audit_events;` : `DROP TRIGGER ${name};`)

/** Runs SQL on the database through a connection of its own, as anyone who can write the file (or log in) could. */
export async function rawSql(location: string, sql: string): Promise<void> {
  if (isPostgresUrl(location)) {
    const client = new pg.Client({ connectionString: location })
    await client.connect()
    return client.query(sql).then(
      () => client.end(),
      (err: Error) => client.end().then(() => Promise.reject(err)),
    )
  }
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(location)
    db.exec(sql, (err) => db.close(() => (err ? reject(err) : resolve())))
  })
}

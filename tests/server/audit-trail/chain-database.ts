import { copyFileSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import sqlite3 from 'sqlite3'
import { inject } from 'vitest'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { initModels } from '../../../server/models/index.ts'

/** A migrated database in a file of its own, as on a server, with the models bound to it. */
export function fileDatabase() {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-chain-'))
  const file = path.join(dir, 'plumbline.sqlite')
  copyFileSync(inject('templateDatabase'), file)
  const sequelize = openDatabase(file)
  initModels(sequelize)
  const cleanup = async () => {
    await sequelize.close()
    rmSync(dir, { recursive: true, force: true })
  }
  return { dir, file, sequelize, cleanup }
}

/** Runs SQL on the database file through a connection of its own, as anyone who can write the file could. */
export function rawSql(file: string, sql: string): Promise<void> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file)
    db.exec(sql, (err) => db.close(() => (err ? reject(err) : resolve())))
  })
}

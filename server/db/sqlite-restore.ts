import { randomUUID } from 'node:crypto'
import { copyFileSync, existsSync, mkdirSync, renameSync, rmSync } from 'node:fs'
import path from 'node:path'
import { checkPlumblineDatabase } from './database-check.ts'
import { all, fileStamp, withFile } from './sqlite-file.ts'

/** The database is open in another connection (a running server): restoring under it would pull the file from under its writes. */
export class DatabaseInUse extends Error {}

/**
 * Leaving WAL needs every other connection to the file closed, in this process or any other, and SQLite refuses it
 * at once otherwise (https://www.sqlite.org/wal.html, "Persistence of WAL mode"). Done, it also folds a WAL left by a
 * crash into the file, so the file moved aside holds every commit on its own.
 */
async function takeOver(live: string): Promise<void> {
  await withFile(live, async (db) => {
    const [mode] = await all<{ journal_mode: string }>(db, 'PRAGMA journal_mode = DELETE').catch((err: NodeJS.ErrnoException) => {
      if (err.code === 'SQLITE_BUSY') throw new DatabaseInUse(`${live} is open in another process (is the server running?); stop it first`)
      throw err
    })
    if (mode?.journal_mode !== 'delete') throw new DatabaseInUse(`${live} could not be taken over (journal mode ${mode?.journal_mode})`)
  })
}

export interface Restored {
  /** The last migration of the restored database; the server applies any newer ones at its next start. */
  migration: string
  /** Where the database that was replaced now is, if there was one. */
  replacedBy?: string
}

/**
 * Puts the backup `file` in place of the database at `live`. The backup is checked on a copy beside `live` first
 * (checkPlumblineDatabase); the current database is kept in `asideDir` as `plumbline-replaced-<time>.sqlite`. Refused,
 * changing nothing, while the current database is open anywhere.
 */
export async function restoreDatabase(file: string, live: string, asideDir: string): Promise<Restored> {
  if (!existsSync(file)) throw new Error(`There is no file at ${file}`)
  const incoming = `${live}.restoring-${randomUUID().slice(0, 8)}`
  try {
    copyFileSync(file, incoming)
    const { migration } = await checkPlumblineDatabase(incoming)
    if (!existsSync(live)) return (renameSync(incoming, live), { migration })
    await takeOver(live)
    mkdirSync(asideDir, { recursive: true })
    const replacedBy = path.join(asideDir, `plumbline-replaced-${fileStamp()}.sqlite`)
    renameSync(live, replacedBy)
    renameSync(incoming, live)
    return { migration, replacedBy }
  } finally {
    rmSync(incoming, { force: true })
  }
}

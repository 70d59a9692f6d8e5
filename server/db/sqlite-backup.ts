import { existsSync, renameSync, rmSync } from 'node:fs'
import { setTimeout as delay } from 'node:timers/promises'
import type sqlite3 from 'sqlite3'
import { checkPlumblineDatabase } from './database-check.ts'
import { withFile } from './sqlite-file.ts'

type Done = (err: Error | null) => void

/** node-sqlite3's Database#backup, which its type declarations leave out (https://github.com/TryGhost/node-sqlite3/wiki/API#backup). */
interface Backup {
  step(pages: number, done: Done): void
  finish(done?: Done): void
  readonly completed: boolean
  readonly failed: boolean
}
type WithBackup = sqlite3.Database & {
  backup(file: string, destName: string, sourceName: string, fileIsDestination: boolean, done: Done): Backup
}

const RETRIES = 50
const RETRY_MS = 100

/**
 * Copies every page in one step: SQLite's online backup then reads one snapshot of the source, the database as of the
 * last commit before the step began (https://www.sqlite.org/backup.html). In WAL the server's writers go on meanwhile,
 * and their later commits are not in the copy. A step refused as busy is tried again; sqlite3 keeps the backup open.
 */
async function copyPages(source: WithBackup, destination: string): Promise<void> {
  const backup = await new Promise<Backup>((resolve, reject) => {
    const started: Backup = source.backup(destination, 'main', 'main', true, (err) => (err ? reject(err) : resolve(started)))
  })
  try {
    for (let i = 0; !backup.completed; i++) {
      const err = await new Promise<Error | null>((resolve) => backup.step(-1, resolve))
      if (err && (backup.failed || i === RETRIES)) throw err
      if (err) await delay(RETRY_MS)
    }
  } finally {
    await new Promise((resolve) => backup.finish(resolve))
  }
}

/**
 * Writes a consistent copy of the database at `source` (the server may be running) to `destination`, checks it
 * (checkPlumblineDatabase) and answers its migration. The copy is written beside under `.partial` first, so a file at
 * `destination` is always a whole backup.
 */
export async function backupDatabase(source: string, destination: string): Promise<{ migration: string }> {
  if (!existsSync(source)) throw new Error(`There is no database at ${source}`)
  const partial = `${destination}.partial`
  rmSync(partial, { force: true })
  try {
    await withFile(source, (db) => copyPages(db as WithBackup, partial))
    const checked = await checkPlumblineDatabase(partial)
    renameSync(partial, destination)
    return checked
  } finally {
    rmSync(partial, { force: true })
  }
}

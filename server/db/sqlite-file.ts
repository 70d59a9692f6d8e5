import sqlite3 from 'sqlite3'

// Plain sqlite3 connections for the backup and restore commands, which work on files outside Sequelize and its models.

/** Opens a database file that must exist; it is never created here. */
export function openFile(file: string): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db: sqlite3.Database = new sqlite3.Database(file, sqlite3.OPEN_READWRITE, (err) => (err ? reject(err) : resolve(db)))
  })
}

export function all<T>(db: sqlite3.Database, sql: string): Promise<T[]> {
  return new Promise((resolve, reject) => db.all(sql, (err: Error | null, rows: T[]) => (err ? reject(err) : resolve(rows))))
}

export function closeFile(db: sqlite3.Database): Promise<void> {
  return new Promise((resolve, reject) => db.close((err) => (err ? reject(err) : resolve())))
}

/** Runs `work` on the open file and closes it whatever happens. */
export async function withFile<T>(file: string, work: (db: sqlite3.Database) => Promise<T>): Promise<T> {
  const db = await openFile(file)
  try {
    return await work(db)
  } finally {
    await closeFile(db)
  }
}

/** A timestamp usable in a file name on every system: 2026-12-03T11-52-55-123Z. */
export const fileStamp = (at = new Date()) => at.toISOString().replace(/[:.]/g, '-')

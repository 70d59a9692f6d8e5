import sqlite3 from 'sqlite3'

/**
 * How long a statement waits for another process's lock (a migration, `npm run backup`, the restore's check) before
 * failing with SQLITE_BUSY; this process's own writers never wait here, they take turns in write-queue.ts.
 * Product default, no published source.
 */
export const BUSY_TIMEOUT_MS = 5_000

// WAL: readers see the last commit and never wait for a writer, and a writer never waits for readers
// (https://www.sqlite.org/wal.html). The mode is kept in the file; asking again on every connection is a no-op, and
// makes a file created or restored by any path WAL before its first write.
//
// synchronous=FULL, not NORMAL: in WAL, NORMAL survives a crash of the application but may lose the last commits on a
// power loss or an OS crash, as the WAL is synced only at checkpoints (https://www.sqlite.org/pragma.html#pragma_synchronous).
// A device deletes an exam from its outbox once the server acknowledges it, so a commit lost after its answer is an
// exam lost on both sides. FULL syncs the WAL at every commit: one fsync per write transaction, and a sync push of many
// exams is one transaction. `npm run bench:load` shows what it costs.
const CONNECTION_PRAGMAS = 'PRAGMA synchronous = FULL; PRAGMA journal_mode = WAL;'

/**
 * sqlite3's Database, set up for a server on every connection Sequelize opens (one per transaction, plus the one for
 * statements outside a transaction): the busy timeout and `synchronous` belong to a connection, not to the file. The
 * PRAGMAs are queued before any statement Sequelize sends, as sqlite3 runs `exec` alone on its connection.
 */
class ServerDatabase extends sqlite3.Database {
  constructor(filename: string, mode: number, callback?: (err: Error | null) => void) {
    super(filename, mode, callback)
    this.configure('busyTimeout', BUSY_TIMEOUT_MS)
    // Leaving WAL off fails only when another process holds the file as it is first switched: the server checks the
    // mode at start (`journalMode` in sequelize.ts), and later connections find WAL already kept in the file.
    this.exec(CONNECTION_PRAGMAS, () => {})
  }
}

/** The module handed to Sequelize as `dialectModule`: sqlite3 with `Database` replaced by ServerDatabase. */
export const serverSqlite3 = { ...sqlite3, Database: ServerDatabase }

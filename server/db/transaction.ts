import { Transaction, type Sequelize } from 'sequelize'
import { holdWriteOrder } from './write-locks.ts'
import { holdsWriteTurn, inWriteTurn } from './write-queue.ts'

/**
 * Runs `work` in a write transaction, committed when it resolves and rolled back when it throws. A check made inside it
 * still holds when its write lands, on either database.
 *
 * Writers of this process wait their turn in one queue per database (write-queue.ts), so concurrent requests queue
 * instead of failing (SQLite: SQLITE_BUSY) or each holding a pooled connection while they wait (PostgreSQL); readers
 * are not queued. SQLite: the transaction is IMMEDIATE, taking the write lock at BEGIN, so a writer of another process
 * (a migration, a restore check) makes this one wait at BEGIN instead of failing when it upgrades its lock
 * (https://www.sqlite.org/lang_transaction.html). PostgreSQL: READ COMMITTED, and the write-order lock (write-locks.ts)
 * taken first, which keeps the writers of every app server one after another as SQLite's lock does. READ COMMITTED,
 * not REPEATABLE READ: a writer that waited for the lock then reads what the one before it committed, instead of
 * failing with a serialisation error every caller would have to retry
 * (https://www.postgresql.org/docs/15/transaction-iso.html).
 */
export function writeTransaction<T>(sequelize: Sequelize, work: (transaction: Transaction) => Promise<T>): Promise<T> {
  // The inner one would wait for the outer to finish, and the outer for the inner: pass the transaction down instead.
  if (holdsWriteTurn(sequelize)) return Promise.reject(new Error('writeTransaction called inside another; pass its transaction instead'))
  if (sequelize.getDialect() === 'sqlite') {
    return inWriteTurn(sequelize, () => sequelize.transaction({ type: Transaction.TYPES.IMMEDIATE }, work))
  }
  const isolationLevel = Transaction.ISOLATION_LEVELS.READ_COMMITTED
  return inWriteTurn(sequelize, () =>
    sequelize.transaction({ isolationLevel }, async (transaction) => {
      await holdWriteOrder(sequelize, transaction)
      return work(transaction)
    }),
  )
}

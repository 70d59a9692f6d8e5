import { Transaction, type Sequelize } from 'sequelize'
import { holdsWriteTurn, inWriteTurn } from './write-queue.ts'

/**
 * Runs `work` in a write transaction, committed when it resolves and rolled back when it throws. Writers of this
 * process wait their turn in one queue per database (write-queue.ts), so concurrent requests queue instead of failing
 * with SQLITE_BUSY; readers are not queued (WAL, see sqlite-connection.ts). On SQLite the transaction is also IMMEDIATE:
 * it takes the write lock at BEGIN, so a writer of another process (a migration, a restore check) makes this one wait
 * at BEGIN instead of failing when it upgrades its lock (https://www.sqlite.org/lang_transaction.html); a check made
 * inside the transaction therefore still holds when its write lands.
 */
export function writeTransaction<T>(sequelize: Sequelize, work: (transaction: Transaction) => Promise<T>): Promise<T> {
  // The inner one would wait for the outer to finish, and the outer for the inner: pass the transaction down instead.
  if (holdsWriteTurn(sequelize)) return Promise.reject(new Error('writeTransaction called inside another; pass its transaction instead'))
  return inWriteTurn(sequelize, () => sequelize.transaction({ type: Transaction.TYPES.IMMEDIATE }, work))
}

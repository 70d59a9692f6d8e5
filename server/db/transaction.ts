import { Transaction, type Sequelize } from 'sequelize'

/**
 * Runs `work` in a write transaction, committed when it resolves and rolled back when it throws. On SQLite the
 * transaction is IMMEDIATE: it takes the write lock at BEGIN, so two writers queue there instead of both reading first
 * and one failing with SQLITE_BUSY when it upgrades its lock (https://www.sqlite.org/lang_transaction.html); a check
 * made inside the transaction therefore still holds when its write lands.
 */
export function writeTransaction<T>(sequelize: Sequelize, work: (transaction: Transaction) => Promise<T>): Promise<T> {
  return sequelize.transaction({ type: Transaction.TYPES.IMMEDIATE }, work)
}

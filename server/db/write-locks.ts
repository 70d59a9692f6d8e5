import type { Sequelize, Transaction } from 'sequelize'

/**
 * Takes the write-order lock for the rest of `transaction`: on PostgreSQL the row lock on the sync counter, which every
 * insert into or update of `exams` takes anyway (postgres-schema.ts) and holds until commit. `writeTransaction` takes it
 * first, so a check-then-write that SQLite's write lock made safe (read a row, check it, write) stays safe with several
 * app servers; as it is the one lock writers take first, two of them never wait for each other (a deadlock). On
 * SQLite the write transaction already holds the database's write lock, so it does nothing.
 */
export async function holdWriteOrder(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  if (sequelize.getDialect() === 'sqlite') return
  await sequelize.query('SELECT "value" FROM "sync_counter" WHERE "id" = 1 FOR UPDATE', { transaction })
}

import type { QueryInterface } from 'sequelize'
import { schemaDialect } from './dialect.ts'

/**
 * Drops a column and leaves the rest of the table as it was: its rows, indexes and triggers. Use it in every `down`
 * instead of `q.removeColumn`, which on SQLite copies the table without its indexes, triggers and ON DELETE rules.
 * Drop the indexes that name the column first.
 */
export async function dropColumn(q: QueryInterface, table: string, column: string): Promise<void> {
  await schemaDialect(q).dropColumn(q, table, column)
}

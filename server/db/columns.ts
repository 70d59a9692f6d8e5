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

/** Renames a table and frees every name made from the old one (PostgreSQL names its primary key and id sequence after it). */
export async function renameTable(q: QueryInterface, from: string, to: string): Promise<void> {
  await schemaDialect(q).renameTable(q, from, to)
}

/** After rows were copied in with their ids, the next generated id follows the highest one stored. */
export async function continueIds(q: QueryInterface, table: string, column: string): Promise<void> {
  await schemaDialect(q).continueIds(q, table, column)
}

import type { QueryInterface } from 'sequelize'
import { postgresSchema } from './postgres-schema.ts'
import { sqliteSchema } from './sqlite-schema.ts'

/** A trigger letting an UPDATE set one column once, from null, and change nothing else. */
export interface SetOnceTrigger {
  name: string
  table: string
  /** The one column an UPDATE may change, and only from null to a value. */
  column: string
  /** Every other column, which must stay as it was. */
  unchanged: readonly string[]
  message: string
}

/** A trigger refusing an INSERT whose column holds a value outside the list. */
export interface AllowedValuesTrigger {
  name: string
  table: string
  column: string
  values: readonly string[]
  message: string
}

/** The statements and table changes that differ between databases; migrations reach them through triggers.ts and columns.ts. */
export interface SchemaDialect {
  noUpdateTrigger(table: string, message: string): string[]
  noDeleteTrigger(table: string, message: string): string[]
  setOnceTrigger(spec: SetOnceTrigger): string[]
  allowedValuesTrigger(spec: AllowedValuesTrigger): string[]
  syncCursorTriggers(): string[]
  dropSyncCursorTriggers(): string[]
  /** Drops one trigger of `table` by name (SQLite names triggers in the schema, PostgreSQL on their table). */
  dropTrigger(table: string, name: string): string[]
  dropColumn(q: QueryInterface, table: string, column: string): Promise<void>
  /** Renames a table with what is named after it (PostgreSQL: its primary key and id sequence), freeing the old names. */
  renameTable(q: QueryInterface, from: string, to: string): Promise<void>
  /** After rows were copied in with their ids: the next id generated follows the highest one stored. */
  continueIds(q: QueryInterface, table: string, column: string): Promise<void>
}

// The one place that knows which databases the schema supports: another dialect gets its own SchemaDialect here.
const DIALECTS: Record<string, SchemaDialect> = { sqlite: sqliteSchema, postgres: postgresSchema }

/** The databases the schema supports, by Sequelize's name for each. */
export type DatabaseName = 'sqlite' | 'postgres'

/**
 * One choice per database, for a shipped migration whose SQL only SQLite reads: SQLite keeps the statement it always
 * ran (the schema it wrote is pinned byte for byte), PostgreSQL gets its own.
 */
export function byDatabase<T>(q: QueryInterface, choices: Record<DatabaseName, T>): T {
  const name = q.sequelize.getDialect()
  if (!(name in choices)) throw new Error(`The schema helpers do not support the ${name} dialect yet`)
  return choices[name as DatabaseName]
}

export function schemaDialect(q: QueryInterface): SchemaDialect {
  const name = q.sequelize.getDialect()
  const dialect = DIALECTS[name]
  if (!dialect) throw new Error(`The schema helpers do not support the ${name} dialect yet`)
  return dialect
}

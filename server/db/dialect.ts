import type { QueryInterface } from 'sequelize'
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
  dropColumn(q: QueryInterface, table: string, column: string): Promise<void>
}

// The one place that knows which databases the schema supports: another dialect gets its own SchemaDialect here.
const DIALECTS: Record<string, SchemaDialect> = { sqlite: sqliteSchema }

export function schemaDialect(q: QueryInterface): SchemaDialect {
  const name = q.sequelize.getDialect()
  const dialect = DIALECTS[name]
  if (!dialect) throw new Error(`The schema helpers do not support the ${name} dialect yet`)
  return dialect
}

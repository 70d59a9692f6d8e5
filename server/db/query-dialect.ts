import type { Sequelize } from 'sequelize'

/**
 * Pieces of query SQL that databases spell differently, for the services that need raw SQL for speed. A service
 * builds its query from these and stays free of any one database's functions.
 */
export interface QueryDialect {
  /** A stored date-time column or a bound ISO 8601 parameter as milliseconds since 1970 (a number). */
  epochMs(expr: string): string
  /** Tells the planner which index answers a join, where the database takes such a hint; empty otherwise. */
  indexHint(index: string): string
}

// SQLite stores date-times as text: julianday reads both its own format and ISO 8601, to the millisecond.
const sqliteQueries: QueryDialect = {
  epochMs: (expr) => `round((julianday(${expr}) - 2440587.5) * 86400000)`,
  indexHint: (index) => `INDEXED BY "${index.replaceAll('"', '""')}"`,
}

// PostgreSQL keeps timestamptz; a bound ISO 8601 text is cast to it. EXTRACT answers numeric, read back as a double.
// It has no index hints: its planner chooses from statistics.
const postgresQueries: QueryDialect = {
  epochMs: (expr) => `(round(EXTRACT(EPOCH FROM CAST(${expr} AS timestamptz)) * 1000))::double precision`,
  indexHint: () => '',
}

const DIALECTS: Record<string, QueryDialect> = { sqlite: sqliteQueries, postgres: postgresQueries }

export function queryDialect(sequelize: Sequelize): QueryDialect {
  const dialect = DIALECTS[sequelize.getDialect()]
  if (!dialect) throw new Error(`The query helpers do not support the ${sequelize.getDialect()} dialect yet`)
  return dialect
}

import { QueryTypes, type Sequelize } from 'sequelize'

export interface StoredObject {
  type: string
  name: string
  tbl_name: string
  sql: string | null
}

const select = <T extends object>(db: Sequelize, sql: string) => db.query<T>(sql, { type: QueryTypes.SELECT })
const quote = (name: string) => `"${name.replaceAll('"', '""')}"`

const isPostgres = (db: Sequelize) => db.getDialect() === 'postgres'

/**
 * sqlite_master as SQLite keeps it: the verbatim text of every table, index and trigger, by type and name. PostgreSQL
 * keeps no text: there, what the catalog says of each (postgresSchema).
 */
export function storedSchema(db: Sequelize): Promise<StoredObject[]> {
  if (isPostgres(db)) return postgresSchema(db)
  return select<StoredObject>(db, `SELECT "type", "name", "tbl_name", "sql" FROM "sqlite_master" ORDER BY "type", "name"`)
}

/** The tables of the application (not the database's own), by name. */
export async function tableNames(db: Sequelize): Promise<string[]> {
  const sql = isPostgres(db)
    ? `SELECT tablename AS "name" FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`
    : `SELECT "name" FROM "sqlite_master" WHERE "type" = 'table' ORDER BY "name"`
  const rows = await select<{ name: string }>(db, sql)
  return rows.map((r) => r.name).filter((name) => !name.startsWith('sqlite_'))
}

export async function columnNames(db: Sequelize, table: string): Promise<string[]> {
  const sql = isPostgres(db)
    ? `SELECT column_name AS "name" FROM information_schema.columns WHERE table_schema = 'public' AND table_name = '${table}' ORDER BY ordinal_position`
    : `PRAGMA table_info(${quote(table)})`
  return (await select<{ name: string }>(db, sql)).map((c) => c.name)
}

/**
 * PostgreSQL's schema from its catalog, one entry per table (its columns by name: type, null, default), constraint,
 * index and trigger (the definitions PostgreSQL prints back), by type and name.
 */
async function postgresSchema(db: Sequelize): Promise<StoredObject[]> {
  const objects: StoredObject[] = []
  for (const table of await tableNames(db)) {
    const columns = await select<object>(
      db,
      `SELECT column_name, data_type, character_maximum_length, is_nullable, column_default FROM information_schema.columns
       WHERE table_schema = 'public' AND table_name = '${table}' ORDER BY column_name`,
    )
    objects.push({ type: 'table', name: table, tbl_name: table, sql: JSON.stringify(columns) })
  }
  const parts = await select<StoredObject>(
    db,
    `SELECT 'constraint' AS "type", c.conname AS "name", t.relname AS "tbl_name", pg_get_constraintdef(c.oid) AS "sql"
     FROM pg_constraint c JOIN pg_class t ON t.oid = c.conrelid JOIN pg_namespace n ON n.oid = t.relnamespace WHERE n.nspname = 'public'
     UNION ALL SELECT 'index', indexname, tablename, indexdef FROM pg_indexes WHERE schemaname = 'public'
     UNION ALL SELECT 'trigger', g.tgname, t.relname, pg_get_triggerdef(g.oid)
     FROM pg_trigger g JOIN pg_class t ON t.oid = g.tgrelid JOIN pg_namespace n ON n.oid = t.relnamespace
     WHERE n.nspname = 'public' AND NOT g.tgisinternal`,
  )
  const order = (o: StoredObject) => `${o.type}\u0000${o.tbl_name}\u0000${o.name}`
  return [...objects, ...parts].sort((a, b) => (order(a) < order(b) ? -1 : order(a) > order(b) ? 1 : 0))
}

/**
 * What the schema means, whatever the order of its columns or the text it was written in: each table's columns (type,
 * null, default, key), foreign keys and indexes (unique, partial, columns), and each trigger's text.
 */
export async function schemaShape(db: Sequelize): Promise<Record<string, unknown>> {
  if (isPostgres(db)) return Object.fromEntries((await postgresSchema(db)).map((o) => [`${o.type} ${o.tbl_name}.${o.name}`, o.sql]))
  const shape: Record<string, unknown> = {}
  for (const table of await tableNames(db)) {
    const columns = await select<{ name: string }>(db, `PRAGMA table_info(${quote(table)})`)
    const keys = await select<object>(db, `PRAGMA foreign_key_list(${quote(table)})`)
    type Index = { name: string; unique: number; origin: string; partial: number }
    const indexes = await select<Index>(db, `PRAGMA index_list(${quote(table)})`)
    const described = []
    for (const { name, unique, origin, partial } of indexes) {
      const on = await select<{ name: string | null }>(db, `PRAGMA index_info(${quote(name)})`)
      described.push({ name, unique, origin, partial, columns: on.map((c) => c.name) })
    }
    const byName = (a: { name: string }, b: { name: string }) => a.name.localeCompare(b.name)
    shape[`table ${table}`] = {
      columns: columns.map((c) => ({ ...c, cid: undefined })).sort(byName),
      keys: keys.map((k) => ({ ...k, id: undefined, seq: undefined })).map((k) => JSON.stringify(k)).sort(),
      indexes: described.sort(byName),
    }
  }
  const triggers = await select<{ name: string; sql: string }>(db, `SELECT "name", "sql" FROM "sqlite_master" WHERE "type" = 'trigger'`)
  for (const { name, sql } of triggers) shape[`trigger ${name}`] = sql
  const explicit = await select<{ name: string; sql: string }>(
    db,
    `SELECT "name", "sql" FROM "sqlite_master" WHERE "type" = 'index' AND "sql" IS NOT NULL`,
  )
  for (const { name, sql } of explicit) shape[`index ${name}`] = sql
  return shape
}

/** Every row of every table, as sorted JSON lines of the chosen columns: what must survive a migration that leaves it alone. */
export async function tableRows(db: Sequelize, columns: Map<string, string[]>): Promise<Record<string, string[]>> {
  const rows: Record<string, string[]> = {}
  for (const [table, names] of columns) {
    const found = await select<Record<string, unknown>>(db, `SELECT ${names.map(quote).join(', ')} FROM ${quote(table)}`)
    rows[table] = found.map((r) => JSON.stringify(r)).sort()
  }
  return rows
}

/** The names of the triggers on one table. */
export async function triggerNames(db: Sequelize, table: string): Promise<string[]> {
  const sql = isPostgres(db)
    ? `SELECT g.tgname AS "name" FROM pg_trigger g JOIN pg_class t ON t.oid = g.tgrelid WHERE t.relname = '${table}' AND NOT g.tgisinternal`
    : `SELECT "name" FROM "sqlite_master" WHERE "type" = 'trigger' AND "tbl_name" = '${table}'`
  return (await select<{ name: string }>(db, sql)).map((t) => t.name).sort()
}

import { QueryTypes, type Sequelize } from 'sequelize'

export interface StoredObject {
  type: string
  name: string
  tbl_name: string
  sql: string | null
}

const select = <T extends object>(db: Sequelize, sql: string) => db.query<T>(sql, { type: QueryTypes.SELECT })
const quote = (name: string) => `"${name.replaceAll('"', '""')}"`

/** sqlite_master as SQLite keeps it: the verbatim text of every table, index and trigger, by type and name. */
export function storedSchema(db: Sequelize): Promise<StoredObject[]> {
  return select<StoredObject>(db, `SELECT "type", "name", "tbl_name", "sql" FROM "sqlite_master" ORDER BY "type", "name"`)
}

/** The tables of the application (not SQLite's own), by name. */
export async function tableNames(db: Sequelize): Promise<string[]> {
  const rows = await select<{ name: string }>(db, `SELECT "name" FROM "sqlite_master" WHERE "type" = 'table' ORDER BY "name"`)
  return rows.map((r) => r.name).filter((name) => !name.startsWith('sqlite_'))
}

export const columnNames = async (db: Sequelize, table: string) =>
  (await select<{ name: string }>(db, `PRAGMA table_info(${quote(table)})`)).map((c) => c.name)

/**
 * What the schema means, whatever the order of its columns or the text it was written in: each table's columns (type,
 * null, default, key), foreign keys and indexes (unique, partial, columns), and each trigger's text.
 */
export async function schemaShape(db: Sequelize): Promise<Record<string, unknown>> {
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

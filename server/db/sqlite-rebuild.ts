import { QueryTypes, type QueryInterface, type Sequelize } from 'sequelize'
import { quoteName } from './quote.ts'

const select = <T extends object>(db: Sequelize, sql: string, replacements?: unknown[]) =>
  db.query<T>(sql, { type: QueryTypes.SELECT, replacements })

const columnsOf = async (db: Sequelize, table: string) =>
  (await select<{ name: string }>(db, `PRAGMA table_info(${quoteName(table)})`)).map((c) => c.name)

/**
 * Runs `work` in one transaction with foreign keys off, as SQLite's recipe for table changes beyond ALTER TABLE asks
 * (https://www.sqlite.org/lang_altertable.html#otheralter): dropping the old table must neither cascade to nor be
 * refused by the rows that reference it. Every foreign key must hold again before the commit.
 */
async function withoutForeignKeys(db: Sequelize, work: () => Promise<void>): Promise<void> {
  const keysOn = async () => (await select<{ foreign_keys: number }>(db, 'PRAGMA foreign_keys'))[0]?.foreign_keys === 1
  const wereOn = await keysOn()
  await db.query('PRAGMA foreign_keys = OFF')
  // The pragma does nothing inside a transaction, and there the DROP TABLE would delete referencing rows.
  if (await keysOn()) throw new Error('A table rebuild cannot run inside a transaction')
  try {
    await db.query('BEGIN IMMEDIATE')
    try {
      await work()
      const broken = await select(db, 'PRAGMA foreign_key_check')
      if (broken.length) throw new Error(`The rebuild would leave ${broken.length} row(s) with a broken foreign key`)
      await db.query('COMMIT')
    } catch (error) {
      await db.query('ROLLBACK')
      throw error
    }
  } finally {
    if (wereOn) await db.query('PRAGMA foreign_keys = ON')
  }
}

/**
 * Replaces a table by one made from `edit(its CREATE TABLE text)`, keeping its rows with their rowids (for the columns
 * both versions have), its indexes and its triggers; an index or trigger that names a column the new table lacks has to
 * be dropped before.
 */
export async function rebuildTable(q: QueryInterface, table: string, edit: (createSql: string) => string): Promise<void> {
  const db = q.sequelize
  const [current] = await select<{ sql: string }>(db, `SELECT "sql" FROM "sqlite_master" WHERE "type" = 'table' AND "name" = ?`, [table])
  if (!current) throw new Error(`There is no table ${table} to rebuild`)
  const dependents = await select<{ sql: string }>(
    db,
    `SELECT "sql" FROM "sqlite_master" WHERE "tbl_name" = ? AND "type" IN ('index', 'trigger') AND "sql" IS NOT NULL ORDER BY rowid`,
    [table],
  )
  const before = await columnsOf(db, table)
  const [name, copy] = [quoteName(table), quoteName(`${table}_rebuild`)]
  await withoutForeignKeys(db, async () => {
    await db.query(`CREATE TEMP TABLE ${copy} AS SELECT rowid AS "rebuild_rowid", * FROM ${name}`)
    await db.query(`DROP TABLE ${name}`)
    await db.query(edit(current.sql))
    const kept = (await columnsOf(db, table)).filter((c) => before.includes(c)).map(quoteName).join(', ')
    await db.query(`INSERT INTO ${name} (rowid, ${kept}) SELECT "rebuild_rowid", ${kept} FROM ${copy}`)
    await db.query(`DROP TABLE ${copy}`)
    for (const { sql } of dependents) await db.query(sql)
  })
}

const QUOTES: Record<string, string> = { "'": "'", '"': '"', '`': '`', '[': ']' }

const trimmed = (sql: string, start: number, end: number): [number, number] => {
  const raw = sql.slice(start, end)
  return [start + raw.length - raw.trimStart().length, start + raw.trimEnd().length]
}

/** The column definitions and table constraints of a CREATE TABLE text, as [start, end) offsets without spaces. */
function definitions(sql: string): [number, number][] {
  const items: [number, number][] = []
  let [depth, start, closing] = [0, 0, '']
  for (let i = 0; i < sql.length; i += 1) {
    const c = sql[i]!
    if (closing) closing = c === closing ? '' : closing
    else if (QUOTES[c]) closing = QUOTES[c]
    else if (c === '(' && ++depth === 1) start = i + 1
    else if ((c === ',' || c === ')') && depth === 1) {
      items.push(trimmed(sql, start, i))
      start = i + 1
      if (c === ')') break
    } else if (c === ')') depth -= 1
  }
  return items
}

const nameOf = (definition: string) => /^(?:`([^`]+)`|"([^"]+)"|\[([^\]]+)\]|(\w+))/.exec(definition)?.slice(1).find(Boolean)

/** The CREATE TABLE text without one column, cut as SQLite's own DROP COLUMN cuts it: the text an ADD COLUMN started from. */
export function withoutColumn(createSql: string, column: string): string {
  const items = definitions(createSql)
  const i = items.findIndex(([from, to]) => nameOf(createSql.slice(from, to))?.toLowerCase() === column.toLowerCase())
  if (i < 0 || items.length < 2) throw new Error(`Cannot cut column ${column} out of: ${createSql}`)
  const [from, to] = i > 0 ? [items[i - 1]![1], items[i]![1]] : [items[0]![0], items[1]![0]]
  return createSql.slice(0, from) + createSql.slice(to)
}

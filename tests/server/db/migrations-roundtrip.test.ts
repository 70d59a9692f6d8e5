import { readFileSync } from 'node:fs'
import { QueryTypes, type Sequelize } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { createMigrator, migrationNames } from '../../../server/db/migrator.ts'
import { isPostgres, isSqlite } from '../database-kind.ts'
import { openBlankDatabase } from '../helpers.ts'
import { columnNames, schemaShape, storedSchema, tableNames, type StoredObject } from './schema-snapshot.ts'
import { seedRows } from './seed-rows.ts'

// sqlite_master of a database migrated by the migrations as shipped up to this one, before triggers went through
// server/db/triggers.ts (commit 0f64ab5): a database made then must read the same as one made now.
const LAST_SHIPPED = '2026.12.07T12.00.00.attachments'
const SHIPPED: StoredObject[] = JSON.parse(readFileSync(new URL('./fixtures/shipped-schema.json', import.meta.url), 'utf8'))

let db: Sequelize
beforeEach(async () => {
  db = await openBlankDatabase()
})
afterEach(() => db.close())

type Rows = Map<string, Record<string, unknown>[]>

/** Every row of every table but umzug's own, by table. */
async function everyRow(): Promise<Rows> {
  const tables = (await tableNames(db)).filter((t) => t !== 'SequelizeMeta')
  const select = (t: string) => db.query<Record<string, unknown>>(`SELECT * FROM "${t}"`, { type: QueryTypes.SELECT })
  return new Map(await Promise.all(tables.map(async (t) => [t, await select(t)] as const)))
}

/** Each table's columns, for the tables (other than umzug's own) that exist now. */
async function columnsByTable(): Promise<Map<string, string[]>> {
  const tables = (await tableNames(db)).filter((t) => t !== 'SequelizeMeta')
  return new Map(await Promise.all(tables.map(async (t) => [t, await columnNames(db, t)] as const)))
}

/** The tables and columns both schemas have: what a down and up of newer migrations must leave alone. */
const common = (a: Map<string, string[]>, b: Map<string, string[]>) =>
  new Map([...a].flatMap(([t, cs]) => (b.has(t) ? [[t, cs.filter((c) => b.get(t)!.includes(c))] as const] : [])))

/** Each table's rows reduced to the given columns, as sorted JSON lines. */
const linesOf = (rows: Rows, columns: Map<string, string[]>) =>
  Object.fromEntries([...columns].map(([t, cs]) => [t, rows.get(t)!.map((r) => JSON.stringify(cs.map((c) => r[c]))).sort()]))

describe.runIf(isSqlite)('the migrations on SQLite (the shipped schema text is what sqlite_master kept)', () => {
  it('as shipped still write the schema they wrote before, byte for byte', async () => {
    await createMigrator(db).up({ to: LAST_SHIPPED })

    expect(await storedSchema(db)).toEqual(SHIPPED)
  })
})

// On PostgreSQL every step is a round trip to the server and DDL takes catalog locks: minutes, not seconds, on a busy machine.
describe('the migrations', { timeout: isPostgres ? 240_000 : undefined }, () => {
  it('on an empty database, each down restores the schema its up started from, and up again writes the same text', async () => {
    const migrator = createMigrator(db)
    await migrator.executed()
    const startedFrom = new Map<string, unknown>()
    for (const name of migrationNames) {
      startedFrom.set(name, await schemaShape(db))
      await migrator.up({ to: name })
    }
    const latest = await storedSchema(db)

    for (const name of [...migrationNames].reverse()) {
      await migrator.down({ to: name })
      expect(await schemaShape(db), `after down to ${name}`).toEqual(startedFrom.get(name))
      await migrator.up()
      expect(await storedSchema(db), `after down to ${name} and up`).toEqual(latest)
    }
  })

  it('on a seeded database, a down and up of newer migrations keep every row of the older tables and columns', async () => {
    const migrator = createMigrator(db)
    await migrator.up()
    await seedRows(db.getQueryInterface())
    const latest = await storedSchema(db)
    const latestColumns = await columnsByTable()

    for (const name of [...migrationNames].reverse()) {
      const before = await everyRow()
      await migrator.down({ to: name })
      const down = await everyRow()
      const kept = common(latestColumns, await columnsByTable())
      await migrator.up()
      expect(await storedSchema(db), `after down to ${name} and up`).toEqual(latest)
      expect(linesOf(down, kept), `rows after down to ${name}`).toEqual(linesOf(before, kept))
      expect(linesOf(await everyRow(), kept), `rows after down to ${name} and up`).toEqual(linesOf(before, kept))
    }
  })
})

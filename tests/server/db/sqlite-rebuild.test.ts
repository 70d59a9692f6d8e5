import { QueryTypes, type Sequelize } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { dropColumn } from '../../../server/db/columns.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { rebuildTable, withoutColumn } from '../../../server/db/sqlite-rebuild.ts'
import { isSqlite } from '../database-kind.ts'

describe.runIf(isSqlite)('SQLite only: the table rebuild behind dropColumn', () => {
  let db: Sequelize
  beforeEach(() => {
    db = openDatabase(':memory:')
  })
  afterEach(() => db.close())

  const select = <T extends object>(sql: string) => db.query<T>(sql, { type: QueryTypes.SELECT })
  const tableSql = async (name: string) =>
    (await select<{ sql: string }>(`SELECT "sql" FROM "sqlite_master" WHERE "name" = '${name}'`))[0]?.sql

  const WIDE = "CREATE TABLE `wide` (`a` TEXT DEFAULT 'x, y', `b` DECIMAL(10,2) NOT NULL, \"c\" TEXT CHECK (c IN ('p', 'q')), [d] INTEGER)"

  describe('withoutColumn', () => {
    it.each(['a', 'b', 'c', 'd'])('cuts column %s out of the CREATE TABLE text as SQLite’s own DROP COLUMN does', async (column) => {
      await db.query(WIDE)
      await db.query(`ALTER TABLE "wide" DROP COLUMN "${column}"`)

      expect(withoutColumn(WIDE, column)).toBe(await tableSql('wide'))
    })
  })

  describe('dropColumn on SQLite', () => {
    beforeEach(async () => {
      await db.query('CREATE TABLE owners (id TEXT PRIMARY KEY)')
      await db.query('CREATE TABLE parents (id TEXT PRIMARY KEY, label TEXT, ownerId TEXT REFERENCES owners (id))')
      await db.query('CREATE INDEX parents_label ON parents (label)')
      await db.query('CREATE TABLE log (note TEXT)')
      await db.query(`CREATE TRIGGER parents_touch AFTER UPDATE ON parents BEGIN INSERT INTO log VALUES (NEW.id); END`)
      await db.query('CREATE TABLE children (id TEXT PRIMARY KEY, parentId TEXT REFERENCES parents (id) ON DELETE CASCADE)')
      await db.query(`INSERT INTO owners VALUES ('o1')`)
      await db.query(`INSERT INTO parents VALUES ('p2', 'second', 'o1'), ('p1', 'first', 'o1')`)
      await db.query(`INSERT INTO children VALUES ('c1', 'p1'), ('c2', 'p2')`)
    })

    it('of a column under a foreign key rebuilds the table with its rows, rowids, index and trigger, and cascades nothing', async () => {
      const before = await select(`SELECT "sql" FROM "sqlite_master" WHERE "tbl_name" = 'parents' AND "type" != 'table'`)

      await dropColumn(db.getQueryInterface(), 'parents', 'ownerId')
      await db.query(`UPDATE parents SET label = 'renamed' WHERE id = 'p1'`)

      expect(await tableSql('parents')).toBe('CREATE TABLE parents (id TEXT PRIMARY KEY, label TEXT)')
      expect(await select('SELECT rowid, id FROM parents ORDER BY rowid')).toEqual([
        { rowid: 1, id: 'p2' },
        { rowid: 2, id: 'p1' },
      ])
      expect(await select(`SELECT "sql" FROM "sqlite_master" WHERE "tbl_name" = 'parents' AND "type" != 'table'`)).toEqual(before)
      expect(await select('SELECT note FROM log')).toEqual([{ note: 'p1' }])
      expect(await select('SELECT id FROM children ORDER BY id')).toEqual([{ id: 'c1' }, { id: 'c2' }])
      expect(await select('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }])
    })

    it('rolls back and keeps the old table when the new one would break a foreign key', async () => {
      await db.query('CREATE TABLE loose (id TEXT PRIMARY KEY, parentId TEXT)')
      await db.query(`INSERT INTO loose VALUES ('l1', 'p1'), ('l2', 'ghost')`)
      const withKey = (sql: string) => sql.replace('parentId TEXT', 'parentId TEXT REFERENCES parents (id)')

      await expect(rebuildTable(db.getQueryInterface(), 'loose', withKey)).rejects.toThrow(/1 row\(s\) with a broken foreign key/)

      expect(await tableSql('loose')).toBe('CREATE TABLE loose (id TEXT PRIMARY KEY, parentId TEXT)')
      expect(await select('SELECT id FROM loose ORDER BY id')).toEqual([{ id: 'l1' }, { id: 'l2' }])
      expect(await select('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }])
    })
  })
})

import { DataTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'
import { byDatabase } from '../dialect.ts'
import { dropSyncCursorTriggers, syncCursorTriggers } from '../triggers.ts'

export async function up(q: QueryInterface): Promise<void> {
  await q.addColumn('exams', 'syncSeq', { type: DataTypes.INTEGER, allowNull: true })
  await q.createTable('sync_counter', {
    id: { type: DataTypes.INTEGER, primaryKey: true },
    value: { type: DataTypes.INTEGER, allowNull: false },
  })
  // Stored exams are numbered in the order they were written: SQLite's rowid; PostgreSQL has none, so creation time.
  const number = byDatabase(q, {
    sqlite: [
      'UPDATE exams SET syncSeq = rowid',
      'INSERT INTO sync_counter (id, value) VALUES (1, (SELECT COALESCE(MAX(syncSeq), 0) FROM exams))',
    ],
    postgres: [
      `UPDATE "exams" SET "syncSeq" = n."seq"
       FROM (SELECT "id", row_number() OVER (ORDER BY "createdAt", "id") AS "seq" FROM "exams") n WHERE n."id" = "exams"."id"`,
      'INSERT INTO "sync_counter" ("id", "value") VALUES (1, (SELECT COALESCE(MAX("syncSeq"), 0) FROM "exams"))',
    ],
  })
  for (const sql of number) await q.sequelize.query(sql)
  await q.addIndex('exams', ['syncSeq'], { unique: true, name: 'exams_sync_seq' })
  await syncCursorTriggers(q)
}

export async function down(q: QueryInterface): Promise<void> {
  await dropSyncCursorTriggers(q)
  await q.removeIndex('exams', 'exams_sync_seq')
  await q.dropTable('sync_counter')
  await dropColumn(q, 'exams', 'syncSeq')
}

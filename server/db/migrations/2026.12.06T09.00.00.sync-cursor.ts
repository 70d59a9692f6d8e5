import { DataTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'
import { dropSyncCursorTriggers, syncCursorTriggers } from '../triggers.ts'

export async function up(q: QueryInterface): Promise<void> {
  await q.addColumn('exams', 'syncSeq', { type: DataTypes.INTEGER, allowNull: true })
  await q.createTable('sync_counter', {
    id: { type: DataTypes.INTEGER, primaryKey: true },
    value: { type: DataTypes.INTEGER, allowNull: false },
  })
  await q.sequelize.query('UPDATE exams SET syncSeq = rowid')
  await q.sequelize.query('INSERT INTO sync_counter (id, value) VALUES (1, (SELECT COALESCE(MAX(syncSeq), 0) FROM exams))')
  await q.addIndex('exams', ['syncSeq'], { unique: true, name: 'exams_sync_seq' })
  await syncCursorTriggers(q)
}

export async function down(q: QueryInterface): Promise<void> {
  await dropSyncCursorTriggers(q)
  await q.removeIndex('exams', 'exams_sync_seq')
  await q.dropTable('sync_counter')
  await dropColumn(q, 'exams', 'syncSeq')
}

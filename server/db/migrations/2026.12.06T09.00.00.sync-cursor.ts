import { DataTypes, type QueryInterface } from 'sequelize'

// One counter row, bumped inside the writing statement: SQLite serialises writers, so the numbers follow commit order
// and a reader never sees a later number before an earlier one. Recursive triggers are off, so the inner UPDATE does not
// fire the update trigger again.
const bump = `
  UPDATE sync_counter SET value = value + 1 WHERE id = 1;
  UPDATE exams SET syncSeq = (SELECT value FROM sync_counter WHERE id = 1) WHERE rowid = NEW.rowid;`

export async function up(q: QueryInterface): Promise<void> {
  await q.addColumn('exams', 'syncSeq', { type: DataTypes.INTEGER, allowNull: true })
  await q.createTable('sync_counter', {
    id: { type: DataTypes.INTEGER, primaryKey: true },
    value: { type: DataTypes.INTEGER, allowNull: false },
  })
  await q.sequelize.query('UPDATE exams SET syncSeq = rowid')
  await q.sequelize.query('INSERT INTO sync_counter (id, value) VALUES (1, (SELECT COALESCE(MAX(syncSeq), 0) FROM exams))')
  await q.addIndex('exams', ['syncSeq'], { unique: true, name: 'exams_sync_seq' })
  await q.sequelize.query(`CREATE TRIGGER exams_sync_seq_insert AFTER INSERT ON exams BEGIN ${bump} END`)
  await q.sequelize.query(`CREATE TRIGGER exams_sync_seq_update AFTER UPDATE ON exams BEGIN ${bump} END`)
}

export async function down(q: QueryInterface): Promise<void> {
  await q.sequelize.query('DROP TRIGGER IF EXISTS exams_sync_seq_update')
  await q.sequelize.query('DROP TRIGGER IF EXISTS exams_sync_seq_insert')
  await q.removeIndex('exams', 'exams_sync_seq')
  await q.dropTable('sync_counter')
  await q.removeColumn('exams', 'syncSeq')
}

import { DataTypes, type QueryInterface } from 'sequelize'

const COLUMNS = ['id', 'examId', 'examVersion', 'signerId', 'signerName', 'meaning', 'signedAt', 'content', 'contentHash']

export async function up(q: QueryInterface): Promise<void> {
  await q.addColumn('exams', 'returnComment', { type: DataTypes.TEXT, allowNull: true })
  await q.createTable('signatures', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    examId: { type: DataTypes.STRING(36), allowNull: false, references: { model: 'exams', key: 'id' }, onDelete: 'RESTRICT' },
    examVersion: { type: DataTypes.INTEGER, allowNull: false },
    signerId: { type: DataTypes.STRING(36), allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    signerName: { type: DataTypes.STRING(120), allowNull: false },
    meaning: { type: DataTypes.STRING(30), allowNull: false },
    signedAt: { type: DataTypes.DATE, allowNull: false },
    // The signed version verbatim, so a superseded signature can still be checked against what it signed.
    content: { type: DataTypes.TEXT, allowNull: false },
    contentHash: { type: DataTypes.STRING(64), allowNull: false },
    supersededAt: { type: DataTypes.DATE, allowNull: true },
  })
  await q.addIndex('signatures', ['examId'])
  await q.addIndex('audit_events', ['at'])
  // 21 CFR 11.10(e), 11.70: a signature is never removed or rewritten; the one change allowed is marking it superseded, once.
  await q.sequelize.query(
    `CREATE TRIGGER signatures_no_delete BEFORE DELETE ON signatures BEGIN SELECT RAISE(ABORT, 'signatures are append-only'); END`,
  )
  const unchanged = COLUMNS.map((c) => `NEW.${c} IS OLD.${c}`).join(' AND ')
  await q.sequelize.query(
    `CREATE TRIGGER signatures_supersede_only BEFORE UPDATE ON signatures
     WHEN NOT (OLD.supersededAt IS NULL AND NEW.supersededAt IS NOT NULL AND ${unchanged})
     BEGIN SELECT RAISE(ABORT, 'signatures are append-only: only supersededAt may be set, once'); END`,
  )
}

export async function down(q: QueryInterface): Promise<void> {
  await q.removeIndex('audit_events', ['at'])
  await q.dropTable('signatures')
  await q.removeColumn('exams', 'returnComment')
}

import { DataTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'
import { noDeleteTrigger, setOnceTrigger } from '../triggers.ts'

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
  await noDeleteTrigger(q, 'signatures', 'signatures are append-only')
  await setOnceTrigger(q, {
    name: 'signatures_supersede_only',
    table: 'signatures',
    column: 'supersededAt',
    unchanged: COLUMNS,
    message: 'signatures are append-only: only supersededAt may be set, once',
  })
}

export async function down(q: QueryInterface): Promise<void> {
  await q.removeIndex('audit_events', ['at'])
  await q.dropTable('signatures')
  await dropColumn(q, 'exams', 'returnComment')
}

import { DataTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'

const COLUMNS = ['venousConfirmed', 'notAssessableReason', 'notAssessableText', 'context'] as const

/**
 * The examiner's confirmation that the column is venous, the reason a column could not be assessed, and the context
 * flags. `venousSigns` stays JSON text: the older list of present signs and today's object both read back through the
 * shared schema. Stored estimates are left exactly as they were saved.
 */
export async function up(q: QueryInterface): Promise<void> {
  // ALTER TABLE … ADD: the exams table is not rebuilt, so its sync-cursor triggers and indexes stay in place.
  await q.addColumn('exams', 'venousConfirmed', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false })
  await q.addColumn('exams', 'notAssessableReason', { type: DataTypes.STRING(30), allowNull: true })
  await q.addColumn('exams', 'notAssessableText', { type: DataTypes.TEXT, allowNull: true })
  await q.addColumn('exams', 'context', { type: DataTypes.TEXT, allowNull: false, defaultValue: '[]' })
}

export async function down(q: QueryInterface): Promise<void> {
  for (const column of [...COLUMNS].reverse()) await dropColumn(q, 'exams', column)
}

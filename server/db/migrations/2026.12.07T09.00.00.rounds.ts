import { DataTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'
import { byDatabase } from '../dialect.ts'

const id = { type: DataTypes.STRING(36), allowNull: false }

export async function up(q: QueryInterface): Promise<void> {
  // Blinded calibration rounds: an educator names patient codes and examiners; each examiner records blinded.
  await q.createTable('rounds', {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    createdBy: { ...id, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'open' },
    createdAt: { type: DataTypes.DATE, allowNull: false },
    closedAt: { type: DataTypes.DATE, allowNull: true },
  })
  await q.addIndex('rounds', ['createdBy'])
  await q.addIndex('rounds', ['status'])
  await q.createTable('round_patient_codes', {
    roundId: { ...id, primaryKey: true, references: { model: 'rounds', key: 'id' }, onDelete: 'CASCADE' },
    patientCode: { type: DataTypes.STRING(40), allowNull: false, primaryKey: true },
    position: { type: DataTypes.INTEGER, allowNull: false },
  })
  await q.createTable('round_examiners', {
    roundId: { ...id, primaryKey: true, references: { model: 'rounds', key: 'id' }, onDelete: 'CASCADE' },
    examinerId: { ...id, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    position: { type: DataTypes.INTEGER, allowNull: false },
  })
  await q.addIndex('round_examiners', ['examinerId'])
  // ALTER TABLE … ADD: the exams table is not rebuilt, so its sync-cursor triggers stay in place.
  await q.addColumn('exams', 'roundId', { type: DataTypes.STRING(36), allowNull: true, references: { model: 'rounds', key: 'id' } })
  // Partial: only round entries are indexed, and the agreement query finds them to leave them out of pairing.
  await q.sequelize.query(
    byDatabase(q, {
      sqlite: 'CREATE INDEX exams_round_id ON exams (roundId, examinerId, patientCode) WHERE roundId IS NOT NULL',
      postgres: 'CREATE INDEX exams_round_id ON exams ("roundId", "examinerId", "patientCode") WHERE "roundId" IS NOT NULL',
    }),
  )
}

export async function down(q: QueryInterface): Promise<void> {
  await q.sequelize.query('DROP INDEX IF EXISTS exams_round_id')
  await dropColumn(q, 'exams', 'roundId')
  await q.dropTable('round_examiners')
  await q.dropTable('round_patient_codes')
  await q.dropTable('rounds')
}

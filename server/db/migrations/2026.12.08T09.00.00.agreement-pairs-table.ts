import { DataTypes, type QueryInterface } from 'sequelize'
import { deriveAllPairs } from '../../agreement/pair-derivation.ts'
import * as packedIndex from './2026.12.05T09.00.00.agreement-pairs.ts'

const TABLE = 'agreement_pairs'
const id = { type: DataTypes.STRING(36), allowNull: false }
const time = { type: DataTypes.DATE, allowNull: false }
const measure = { type: DataTypes.DOUBLE, allowNull: false }
const term = { type: DataTypes.STRING(20), allowNull: false }

/** The columns of one side of a pair, `earlier` or `later`. */
const side = (prefix: 'earlier' | 'later') => ({
  [`${prefix}ExamId`]: { ...id, unique: true },
  [`${prefix}ExaminerId`]: id,
  [`${prefix}TeamId`]: id,
  [`${prefix}ExaminedAt`]: time,
  [`${prefix}HeightCm`]: measure,
  [`${prefix}CvpCmH2O`]: measure,
  [`${prefix}InclinationDeg`]: measure,
  [`${prefix}Vein`]: term,
  [`${prefix}ColumnTop`]: term,
})

/**
 * Agreement pairs as rows, written again for a patient code in the transaction of every write that can change its
 * pairs (server/agreement/pair-derivation.ts), and read with plain indexed queries. They replace the packed
 * expression index and the change lookup of 2026.12.05T09.00.00.agreement-pairs, which only SQLite could run.
 * No foreign keys: the rows are derived, and a migration that rebuilds `exams` must not cascade into them.
 */
export async function up(q: QueryInterface): Promise<void> {
  await q.createTable(TABLE, {
    ...side('earlier'),
    earlierExamId: { ...id, primaryKey: true },
    ...side('later'),
    patientCode: { type: DataTypes.STRING(40), allowNull: false },
    pairedAt: time,
    meanInclinationDeg: measure,
    inclinationBand: term,
  })
  await q.addIndex(TABLE, ['patientCode'], { name: 'agreement_pairs_patient_code' })
  await q.addIndex(TABLE, ['pairedAt'], { name: 'agreement_pairs_paired_at' })
  for (const column of ['earlierExaminerId', 'laterExaminerId', 'earlierTeamId', 'laterTeamId'])
    await q.addIndex(TABLE, [column, 'pairedAt'], { name: `agreement_pairs_${column.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`)}` })
  await packedIndex.down(q)
  await q.sequelize.transaction((transaction) => deriveAllPairs({ sequelize: q.sequelize, transaction }))
}

export async function down(q: QueryInterface): Promise<void> {
  await packedIndex.up(q)
  await q.dropTable(TABLE)
}

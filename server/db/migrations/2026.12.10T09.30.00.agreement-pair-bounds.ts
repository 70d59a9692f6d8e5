import { DataTypes, Op, type QueryInterface } from 'sequelize'
import { derivePairs, type PairingRule } from '../../agreement/pair-derivation.ts'
import { readingsWhere } from '../../agreement/pair-readings.ts'

const TABLE = 'agreement_pairs'
const ROWS_PER_INSERT = 500
const id = { type: DataTypes.STRING(36), allowNull: false }
const time = { type: DataTypes.DATE, allowNull: false }
const measure = { type: DataTypes.DOUBLE, allowNull: false }
const term = { type: DataTypes.STRING(20), allowNull: false }

type Row = Record<string, unknown> & { patientCode: string; earlierColumnTop: string; laterColumnTop: string }

/** The columns of one side of a pair; `heightNullable` for an upper bound ("not filled"), which has no height. */
const side = (prefix: 'earlier' | 'later', heightNullable: boolean) => ({
  [`${prefix}ExamId`]: { ...id, unique: true },
  [`${prefix}ExaminerId`]: id,
  [`${prefix}TeamId`]: id,
  [`${prefix}ExaminedAt`]: time,
  [`${prefix}HeightCm`]: { ...measure, allowNull: heightNullable },
  [`${prefix}CvpCmH2O`]: measure,
  [`${prefix}InclinationDeg`]: measure,
  [`${prefix}Vein`]: term,
  [`${prefix}ColumnTop`]: term,
})

/** The table as 2026.12.08T09.00.00.agreement-pairs-table made it, with its indexes, but for the heights' nullability. */
async function createPairs(q: QueryInterface, heightNullable: boolean): Promise<void> {
  await q.createTable(TABLE, {
    ...side('earlier', heightNullable),
    earlierExamId: { ...id, primaryKey: true },
    ...side('later', heightNullable),
    patientCode: { type: DataTypes.STRING(40), allowNull: false },
    pairedAt: time,
    meanInclinationDeg: measure,
    inclinationBand: term,
  })
  await q.addIndex(TABLE, ['patientCode'], { name: 'agreement_pairs_patient_code' })
  await q.addIndex(TABLE, ['pairedAt'], { name: 'agreement_pairs_paired_at' })
  for (const column of ['earlierExaminerId', 'laterExaminerId', 'earlierTeamId', 'laterTeamId'])
    await q.addIndex(TABLE, [column, 'pairedAt'], { name: `agreement_pairs_${column.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`)}` })
}

/**
 * Makes the table again with the rows `keep` passes, then derives again, under `rule`, the pairs of the patient codes
 * `codesOf` names: the rows stay as stored (every write derived its patient's pairs), only the codes the rule touches
 * change.
 */
interface Remake {
  heightNullable: boolean
  keep: (row: Row) => boolean
  codesOf: (rows: Row[]) => Promise<string[]>
  rule: PairingRule
}

async function remake(q: QueryInterface, { heightNullable, keep, codesOf, rule }: Remake): Promise<void> {
  const rows = (await q.select(null, TABLE, {})) as Row[]
  const codes = await codesOf(rows)
  await q.dropTable(TABLE)
  await createPairs(q, heightNullable)
  const kept = rows.filter(keep)
  for (let i = 0; i < kept.length; i += ROWS_PER_INSERT) await q.bulkInsert(TABLE, kept.slice(i, i + ROWS_PER_INSERT))
  await q.sequelize.transaction((transaction) => derivePairs(codes, { sequelize: q.sequelize, transaction }, rule))
}

const isBound = (row: Row) => row.earlierColumnTop !== 'seen' || row.laterColumnTop !== 'seen'

/** The patient codes with a reading that is a bound: the only ones whose pairs the new rule can change. */
async function codesWithBoundReadings(q: QueryInterface): Promise<string[]> {
  const readings = await q.sequelize.transaction((transaction) =>
    readingsWhere({ sequelize: q.sequelize, transaction }, { columnTop: { [Op.in]: ['above-neck', 'not-filled'] } }),
  )
  return readings.map((r) => r.patientCode)
}

/**
 * Bounds pair too: an exam whose column top was above the neck (a lower bound with a height) or not filled (an upper
 * bound, no height) takes part in pairing, so the kappas can count it (McGee 1998, Am Heart J 136:10–18: a lower bound
 * above 3 cm is elevated, "no column even lying flat" is not). The heights become nullable for the upper bound.
 */
export async function up(q: QueryInterface): Promise<void> {
  await remake(q, { heightNullable: true, keep: () => true, codesOf: () => codesWithBoundReadings(q), rule: 'with-bounds' })
}

/** Back to heights on both sides: the pairs with a bound go, and their patients' seen exams pair again among themselves. */
export async function down(q: QueryInterface): Promise<void> {
  const codesOf = async (rows: Row[]) => rows.filter(isBound).map((row) => row.patientCode)
  await remake(q, { heightNullable: false, keep: (row) => !isBound(row), codesOf, rule: 'seen-only' })
}

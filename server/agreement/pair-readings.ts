import { Op, type WhereOptions } from 'sequelize'
import { withDefaults } from '#shared/schemas/settings'
import type { PairWrite } from './pair-derivation.ts'
import { PAIR_COLUMN_TOPS, type PairColumnTop, type Reading } from './pairs.ts'

interface ExamRow {
  id: string
  patientCode: string
  examinerId: string
  teamId: string
  examinedAt: Date | string
  verticalHeightCm: number | null
  cvpCmH2O: number
  inclinationDeg: number
  vein: string
  columnTop: PairColumnTop
}

const ATTRIBUTES = ['id', 'patientCode', 'examinerId', 'teamId', 'examinedAt', 'verticalHeightCm', 'cvpCmH2O', 'inclinationDeg', 'vein', 'columnTop']
// A reading is a non-draft exam with an estimate or a bound: its column top seen or above the neck, with a height, or
// not filled (an upper bound without one). Bounds pair too, as the kappas count them (McGee 1998, Am Heart J
// 136:10–18: a lower bound above 3 cm is elevated, "no column even lying flat" is not). Calibration-round entries never
// pair (server/rounds): the round has its own results, and counting them twice would skew the dashboard and the local
// observer spread; pairing them would also show blinded readings before the round closes.
const READING = {
  status: { [Op.ne]: 'draft' },
  columnTop: { [Op.in]: [...PAIR_COLUMN_TOPS] },
  [Op.or]: [{ verticalHeightCm: { [Op.ne]: null } }, { columnTop: 'not-filled' }],
  cvpCmH2O: { [Op.ne]: null },
  roundId: null,
}

const readingOf = (e: ExamRow): Reading => ({
  examId: e.id,
  patientCode: e.patientCode,
  examinerId: e.examinerId,
  teamId: e.teamId,
  at: new Date(e.examinedAt).getTime(),
  heightCm: e.columnTop === 'not-filled' ? null : e.verticalHeightCm,
  cvpCmH2O: e.cvpCmH2O,
  inclinationDeg: e.inclinationDeg,
  vein: e.vein,
  columnTop: e.columnTop,
})

/**
 * The readings among the exams matching `where`, in order of patient code and time. Query-interface calls rather than
 * models, here and below, so that a migration can derive the pairs before any model is bound.
 */
export async function readingsWhere({ sequelize, transaction }: PairWrite, where: WhereOptions): Promise<Reading[]> {
  const order: [string, string][] = [['patientCode', 'ASC'], ['examinedAt', 'ASC'], ['createdAt', 'ASC'], ['id', 'ASC']]
  const options = { attributes: ATTRIBUTES, where: { ...READING, ...where }, order, transaction }
  const rows = (await sequelize.getQueryInterface().select(null, 'exams', options)) as ExamRow[]
  return rows.map(readingOf)
}

/** The pairing window of the settings in force, read in the write's own transaction. */
export async function windowIn({ sequelize, transaction }: PairWrite): Promise<number> {
  const options = { attributes: ['values'], order: [['version', 'DESC']] as [string, string][], limit: 1, transaction }
  const [latest] = (await sequelize.getQueryInterface().select(null, 'settings', options)) as { values: string }[]
  return withDefaults(latest && JSON.parse(latest.values)).pairWindowMinutes
}

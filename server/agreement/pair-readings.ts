import { Op, type WhereOptions } from 'sequelize'
import { withDefaults } from '#shared/schemas/settings'
import type { PairWrite } from './pair-derivation.ts'
import type { Reading } from './pairs.ts'

interface ExamRow {
  id: string
  patientCode: string
  examinerId: string
  teamId: string
  examinedAt: Date | string
  verticalHeightCm: number
  cvpCmH2O: number
  inclinationDeg: number
  vein: string
  columnTop: string
}

const ATTRIBUTES = ['id', 'patientCode', 'examinerId', 'teamId', 'examinedAt', 'verticalHeightCm', 'cvpCmH2O', 'inclinationDeg', 'vein', 'columnTop']
// A reading is a non-draft exam whose column top was seen, so it has a height (bound 'point'). Calibration-round
// entries never pair (server/rounds): the round has its own results, and counting them twice would skew the dashboard
// and the local observer spread; pairing them would also show blinded readings before the round closes.
const READING = {
  status: { [Op.ne]: 'draft' },
  columnTop: 'seen',
  verticalHeightCm: { [Op.ne]: null },
  cvpCmH2O: { [Op.ne]: null },
  roundId: null,
}

const readingOf = (e: ExamRow): Reading => ({
  examId: e.id,
  patientCode: e.patientCode,
  examinerId: e.examinerId,
  teamId: e.teamId,
  at: new Date(e.examinedAt).getTime(),
  heightCm: e.verticalHeightCm,
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

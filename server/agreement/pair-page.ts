import { literal, Op } from 'sequelize'
import { AgreementPairModel } from '../models/index.ts'
import { POINT_PAIRS, type PairWhere } from './agreement-scope.ts'
import { firstExamIdSql, flipsSql } from './orientation-sql.ts'
import { examPairOf, type PairRow } from './pair-rows.ts'
import type { ExamPair } from './pairs.ts'

// Derivable from these, so not read: pairedAt, meanInclinationDeg, inclinationBand.
const ATTRIBUTES: (keyof PairRow)[] = [
  'earlierExamId', 'laterExamId', 'patientCode', 'earlierExaminerId', 'laterExaminerId', 'earlierTeamId', 'laterTeamId',
  'earlierExaminedAt', 'laterExaminedAt', 'earlierHeightCm', 'laterHeightCm', 'earlierCvpCmH2O', 'laterCvpCmH2O',
  'earlierInclinationDeg', 'laterInclinationDeg', 'earlierVein', 'laterVein', 'earlierColumnTop', 'laterColumnTop',
]

export interface PairPage {
  pairs: ExamPair[]
  /** Every matching point pair, not only this page's. */
  total: number
}

/** The keys of one page, newest first, then by the exam id of the first reading in the difference. */
async function pageKeys(points: PairWhere, attendingIds: readonly string[], page: number, pageSize: number): Promise<string[]> {
  const firstExamId = literal(firstExamIdSql(flipsSql(AgreementPairModel.sequelize!, attendingIds)))
  const order: [string | ReturnType<typeof literal>, string][] = [['pairedAt', 'DESC'], [firstExamId, 'ASC']]
  const offset = (page - 1) * pageSize
  const keys = await AgreementPairModel.findAll({ attributes: ['earlierExamId'], where: points, order, limit: pageSize, offset, raw: true })
  return keys.map((key) => key.earlierExamId)
}

/**
 * One page of the matching pairs with a measured height on both sides (those the plots draw), and how many there are.
 * The pages a download walks through are found in the index `agreement_pairs_time` alone, and only the page's own
 * rows are read.
 */
export async function pairPage(where: PairWhere, attendingIds: readonly string[], page: number, pageSize: number): Promise<PairPage> {
  const points = { [Op.and]: [where, POINT_PAIRS] }
  const [ids, total] = await Promise.all([pageKeys(points, attendingIds, page, pageSize), AgreementPairModel.count({ where: points })])
  const rows = await AgreementPairModel.findAll({ attributes: ATTRIBUTES, where: { earlierExamId: { [Op.in]: ids } }, raw: true })
  const byId = new Map(rows.map((row) => [row.earlierExamId, row as PairRow]))
  // A pair derived away between the two reads is left out of its page.
  return { pairs: ids.flatMap((id) => (byId.has(id) ? [examPairOf(byId.get(id)!)] : [])), total }
}

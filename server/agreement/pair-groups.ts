import { col, literal } from 'sequelize'
import { quoteName } from '../db/quote.ts'
import { AgreementPairModel } from '../models/index.ts'
import type { PairWhere } from './agreement-scope.ts'
import type { PairColumnTop } from './pairs.ts'
import { categoryLevelSql, elevatedLevelSql } from './reading-levels-sql.ts'

/**
 * The matching pairs of one examiner pair whose readings are of one kind (column tops and the kappas' levels), with the
 * sums the statistics need: the agreement summary is computed from these groups, never from the pairs one by one.
 */
export interface PairGroup {
  earlierExaminerId: string
  laterExaminerId: string
  earlierColumnTop: PairColumnTop
  laterColumnTop: PairColumnTop
  /** The kappas' levels of each reading (`reading-levels-sql.ts`); null when the reading does not decide one. */
  earlierElevated: number | null
  laterElevated: number | null
  earlierCategory: number | null
  laterCategory: number | null
  n: number
  /** Σ(earlier h − later h) and Σ of its square; meaningful for point pairs only (both column tops seen). */
  sumDifference: number
  sumDifferenceSquares: number
  /** Σ(earlier h + later h) and Σ of its square, for the ICC. */
  sumTotal: number
  sumTotalSquares: number
}

const [earlier, later] = [quoteName('earlierHeightCm'), quoteName('laterHeightCm')]
const [difference, total] = [`(${earlier} - ${later})`, `(${earlier} + ${later})`]
const KEYS = ['earlierExaminerId', 'laterExaminerId', 'earlierColumnTop', 'laterColumnTop'] as const
const LEVELS: [keyof PairGroup, string][] = [
  ['earlierElevated', elevatedLevelSql('earlier')],
  ['laterElevated', elevatedLevelSql('later')],
  ['earlierCategory', categoryLevelSql('earlier')],
  ['laterCategory', categoryLevelSql('later')],
]
const SUMS: [keyof PairGroup, string][] = [
  ['n', 'COUNT(*)'],
  ['sumDifference', `SUM(${difference})`],
  ['sumDifferenceSquares', `SUM(${difference} * ${difference})`],
  ['sumTotal', `SUM(${total})`],
  ['sumTotalSquares', `SUM(${total} * ${total})`],
]
const ATTRIBUTES = [...KEYS, ...[...LEVELS, ...SUMS].map(([name, sql]) => [literal(sql), name] as [ReturnType<typeof literal>, string])]
// The levels by their output names, which SQLite and PostgreSQL both accept in GROUP BY (no column shares them).
const GROUP = [...KEYS, ...LEVELS.map(([name]) => col(name))]

// PostgreSQL answers COUNT and integer SUMs as text; a group of bounds without heights sums to NULL.
const numberOrNull = (value: unknown) => (value === null || value === undefined ? null : Number(value))

/** One aggregate query over the matching pairs (covered by the index `agreement_pairs_examiner_pairs`). */
export async function pairGroups(where: PairWhere): Promise<PairGroup[]> {
  const rows = (await AgreementPairModel.findAll({ attributes: ATTRIBUTES, where, group: GROUP, raw: true })) as unknown as Record<string, unknown>[]
  return rows.map((row) => {
    const group = { ...row } as Record<string, unknown>
    for (const [name] of [...LEVELS, ...SUMS]) group[name] = numberOrNull(row[name])
    for (const [name] of SUMS) group[name] ??= 0
    return group as unknown as PairGroup
  })
}

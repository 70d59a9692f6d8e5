import { fn, col, literal, Op } from 'sequelize'
import { blandAltmanFromSums, type DifferenceSums } from '#shared/stats/index'
import type { AgreementTrend, MonthAgreement } from '#shared/schemas/agreement'
import { quoteName } from '../db/quote.ts'
import { AgreementPairModel } from '../models/index.ts'
import { POINT_PAIRS, type PairWhere } from './agreement-scope.ts'
import { differenceSql, flipsSql } from './orientation-sql.ts'
import { millis } from './pair-rows.ts'

/** Months since 1970-01 (UTC) of an epoch time: a key that sorts and counts on without calendar arithmetic. */
const monthIndex = (ms: number) => new Date(ms).getUTCFullYear() * 12 + new Date(ms).getUTCMonth()
const monthStart = (index: number) => new Date(Date.UTC(Math.floor(index / 12), index % 12, 1))
const monthLabel = (index: number) => `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}`

function monthOf(index: number, sums: DifferenceSums | undefined): MonthAgreement {
  const month = monthLabel(index)
  if (!sums?.n) return { month, n: 0, bias: null, sd: null, loa: null }
  const r = blandAltmanFromSums(sums)
  if (r.ok) return { month, n: sums.n, bias: r.bias, sd: r.sd, loa: r.loa }
  return { month, n: sums.n, bias: sums.sum, sd: null, loa: null }
}

/**
 * The month of `pairedAt` as its offset from `start`, by halving the months `start`…`end` (a comparison per halving):
 * the databases share no function that takes a month from a timestamp, but they all compare timestamps.
 */
function monthSql(start: number, end: number): string {
  if (start === end) return '0'
  const mid = Math.floor((start + end + 1) / 2)
  const before = `${quoteName('pairedAt')} < ${AgreementPairModel.sequelize!.escape(monthStart(mid))}`
  return `CASE WHEN ${before} THEN ${monthSql(start, mid - 1)} ELSE ${mid - start} + ${monthSql(mid, end)} END`
}

async function monthRange(where: PairWhere): Promise<[number, number] | null> {
  const attributes: [ReturnType<typeof fn>, string][] = [[fn('MIN', col('pairedAt')), 'first'], [fn('MAX', col('pairedAt')), 'last']]
  const range = (await AgreementPairModel.findOne({ attributes, where, raw: true })) as unknown as { first: Date | string | null; last: Date | string | null }
  return range.first === null || range.last === null ? null : [monthIndex(millis(range.first)), monthIndex(millis(range.last))]
}

/**
 * The Bland–Altman bias, SD and limits per calendar month (UTC) of the pairs' time (their earlier exam), with the
 * differences in the pairs' own order as in the summary, over the pairs with a measured height on both sides (a bound
 * has no difference to take); every month between the first and the last is listed.
 */
export async function monthlyTrend(where: PairWhere, attendingIds: readonly string[]): Promise<AgreementTrend> {
  const points = { [Op.and]: [where, POINT_PAIRS] }
  const range = await monthRange(points)
  if (!range) return { months: [] }
  const [start, end] = range
  const difference = differenceSql(flipsSql(AgreementPairModel.sequelize!, attendingIds))
  const attributes: [ReturnType<typeof literal>, string][] = [
    [literal(monthSql(start, end)), 'month'],
    [literal('COUNT(*)'), 'n'],
    [literal(`SUM(${difference})`), 'sum'],
    [literal(`SUM((${difference}) * (${difference}))`), 'sumOfSquares'],
  ]
  const rows = (await AgreementPairModel.findAll({ attributes, where: points, group: [col('month')], raw: true })) as unknown as Record<string, unknown>[]
  const byMonth = new Map(rows.map((r) => [Number(r.month), { n: Number(r.n), sum: Number(r.sum), sumOfSquares: Number(r.sumOfSquares) }]))
  return { months: Array.from({ length: end - start + 1 }, (_, i) => monthOf(start + i, byMonth.get(i))) }
}

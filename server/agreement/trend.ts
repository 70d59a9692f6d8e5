import { blandAltman } from '#shared/stats/index'
import type { AgreementTrend, MonthAgreement } from '#shared/schemas/agreement'
import { pairTime } from './agreement-scope.ts'
import type { Pair } from './pairs.ts'
import { pointHeight } from './reading-categories.ts'
import { pointPairs } from './summary.ts'

/** Months since 1970-01 (UTC) of an epoch time: a key that sorts and counts on without calendar arithmetic. */
function monthIndex(ms: number): number {
  const date = new Date(ms)
  return date.getUTCFullYear() * 12 + date.getUTCMonth()
}

const monthLabel = (index: number) => `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}`

function monthOf(index: number, first: number[], second: number[]): MonthAgreement {
  const month = monthLabel(index)
  const n = first.length
  if (n === 0) return { month, n, bias: null, sd: null, loa: null }
  const r = blandAltman(first, second)
  if (r.ok) return { month, n, bias: r.bias, sd: r.sd, loa: r.loa }
  return { month, n, bias: first[0]! - second[0]!, sd: null, loa: null }
}

/**
 * The Bland–Altman bias, SD and limits per calendar month (UTC) of the pairs' time (their earlier exam), with the
 * differences in the pairs' own order as in the summary, over the pairs with a measured height on both sides (a bound
 * has no difference to take); every month between the first and the last is listed.
 */
export function monthlyTrend(pairs: readonly Pair[]): AgreementTrend {
  const byMonth = new Map<number, { first: number[]; second: number[] }>()
  for (const pair of pointPairs(pairs)) {
    const key = monthIndex(pairTime(pair))
    let month = byMonth.get(key)
    if (!month) byMonth.set(key, (month = { first: [], second: [] }))
    month.first.push(pointHeight(pair.first))
    month.second.push(pointHeight(pair.second))
  }
  if (!byMonth.size) return { months: [] }
  const keys = [...byMonth.keys()]
  const [start, end] = [Math.min(...keys), Math.max(...keys)]
  const months: MonthAgreement[] = []
  for (let index = start; index <= end; index++) {
    const month = byMonth.get(index)
    months.push(monthOf(index, month?.first ?? [], month?.second ?? []))
  }
  return { months }
}

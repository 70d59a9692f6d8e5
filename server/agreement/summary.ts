import { blandAltman, iccOneWay } from '#shared/stats/index'
import type { AgreementSummary, ExaminerAgreement } from '#shared/schemas/agreement'
import type { Examiner } from './examiners.ts'
import type { Pair, Reading } from './pairs.ts'
import { isPoint, pointHeight } from './reading-categories.ts'
import { kappaCategoryOf, kappaElevatedOf } from './summary-kappas.ts'

const MIN_PAIRS = 2
const ROLE_ORDER: Record<Examiner['role'], number> = { resident: 0, attending: 1 }

const unavailable = (reason: string) => ({ unavailable: reason })
const heights = (readings: Reading[]) => readings.map(pointHeight)

export const HEIGHTS_LEFT_OUT =
  'A bound on either side (column top above the neck or not filled): no measured height to take a difference of'

/** The pairs with a measured height on both sides: the only ones a difference or an ICC can take. */
export const pointPairs = (pairs: readonly Pair[]): Pair[] => pairs.filter((p) => isPoint(p.first) && isPoint(p.second))

function blandAltmanOf(first: number[], second: number[]): AgreementSummary['blandAltman'] {
  const r = blandAltman(first, second)
  return r.ok ? { bias: r.bias, sd: r.sd, loa: r.loa, biasCi: r.biasCi, loaCi: r.loaCi } : unavailable(r.reason)
}

/**
 * ICC(1,1), one-way random effects (Shrout & Fleiss 1979, case 1): each patient is read by its own pair of examiners,
 * so no examiner effect can be separated out. Calibration rounds, fully crossed, keep ICC(2,1).
 */
function iccOf(first: number[], second: number[]): AgreementSummary['icc'] {
  const r = iccOneWay(first.map((a, i) => [a, second[i]!]))
  return r.ok ? { value: r.value, ci: r.ci } : unavailable(r.reason)
}

/** Each examiner's own reading against their partner's, over point pairs; `focus` keeps only that examiner. */
export function byExaminer(pairs: Pair[], examiners: Map<string, Examiner>, focus?: string): ExaminerAgreement[] {
  const sides = new Map<string, { own: number[]; partner: number[] }>()
  const add = (own: Reading, partner: Reading) => {
    const side = sides.get(own.examinerId) ?? sides.set(own.examinerId, { own: [], partner: [] }).get(own.examinerId)!
    side.own.push(pointHeight(own))
    side.partner.push(pointHeight(partner))
  }
  for (const { first, second } of pairs) {
    add(first, second)
    add(second, first)
  }
  const ids = focus === undefined ? [...sides.keys()] : [focus].filter((id) => sides.has(id))
  return ids
    .map((examinerId) => {
      const { own, partner } = sides.get(examinerId)!
      const who = examiners.get(examinerId) ?? { name: '', role: 'resident' as const }
      const r = blandAltman(own, partner)
      const stats = r.ok ? { bias: r.bias, sd: r.sd, loa: r.loa } : { bias: own[0]! - partner[0]!, sd: null, loa: null }
      return { examinerId, name: who.name, role: who.role, n: own.length, ...stats }
    })
    .sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.name.localeCompare(b.name) || a.examinerId.localeCompare(b.examinerId))
}

/** Bland–Altman and ICC(1,1) over the point pairs; too few → the reason, never NaN. */
function heightStatistics(points: Pair[], n: number) {
  if (points.length >= MIN_PAIRS) {
    const [first, second] = [heights(points.map((p) => p.first)), heights(points.map((p) => p.second))]
    return { blandAltman: blandAltmanOf(first, second), icc: iccOf(first, second) }
  }
  const few = points.length === 0 ? 'none' : 'only 1'
  const reason = unavailable(`Needs at least ${MIN_PAIRS} pairs with a measured height on both sides; ${few} of the ${n} pairs has`)
  return { blandAltman: reason, icc: reason }
}

/** Bland–Altman, ICC(1,1) and kappas over pairs, in the difference's order, with what each statistic left out. */
export function summarize(pairs: Pair[], examiners: Map<string, Examiner>, focus?: string): AgreementSummary {
  const n = pairs.length
  const points = pointPairs(pairs)
  const rows = byExaminer(points, examiners, focus)
  const elevated = kappaElevatedOf(pairs)
  const category = kappaCategoryOf(pairs)
  const heightsLeftOut = { n: n - points.length, reason: HEIGHTS_LEFT_OUT }
  const leftOut = { heights: heightsLeftOut, kappaElevated: elevated.leftOut, kappaCategory: category.leftOut }
  if (n < MIN_PAIRS) {
    const reason = unavailable(`Needs at least ${MIN_PAIRS} pairs; ${n === 0 ? 'none match' : 'only 1 matches'}`)
    return { n, blandAltman: reason, icc: reason, kappaElevated: reason, kappaCategory: reason, byExaminer: rows, leftOut }
  }
  const { blandAltman, icc } = heightStatistics(points, n)
  return { n, blandAltman, icc, kappaElevated: elevated.kappa, kappaCategory: category.kappa, byExaminer: rows, leftOut }
}

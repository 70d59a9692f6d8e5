import { blandAltmanFromSums, iccOneWayFromSums } from '#shared/stats/index'
import type { AgreementSummary } from '#shared/schemas/agreement'
import { byExaminer } from './examiner-bias.ts'
import type { Examiner } from './examiners.ts'
import type { PairGroup } from './pair-groups.ts'
import { flips } from './pairs.ts'
import { kappaCategoryOf, kappaElevatedOf } from './summary-kappas.ts'

const MIN_PAIRS = 2

const unavailable = (reason: string) => ({ unavailable: reason })
const total = (groups: readonly PairGroup[], of: (g: PairGroup) => number) => groups.reduce((sum, g) => sum + of(g), 0)

export const HEIGHTS_LEFT_OUT =
  'A bound on either side (column top above the neck or not filled): no measured height to take a difference of'

/** A group of pairs with a measured height on both sides: the only ones a difference or an ICC can take. */
export const isPointGroup = (g: PairGroup) => g.earlierColumnTop === 'seen' && g.laterColumnTop === 'seen'

/**
 * Bland–Altman of first − second, and ICC(1,1), one-way random effects (Shrout & Fleiss 1979, case 1): each patient is
 * read by its own pair of examiners, so no examiner effect can be separated out (calibration rounds, fully crossed,
 * keep ICC(2,1)). Each pair is a subject with readings a and b: Σx = Σ(a + b), Σx² = (Σ(a + b)² + Σ(a − b)²)/2.
 */
function heightStatistics(points: readonly PairGroup[], isAttending: (id: string) => boolean) {
  const n = total(points, (g) => g.n)
  const sum = total(points, (g) => (flips(g.earlierExaminerId, g.laterExaminerId, isAttending) ? -g.sumDifference : g.sumDifference))
  const differenceSquares = total(points, (g) => g.sumDifferenceSquares)
  const ba = blandAltmanFromSums({ n, sum, sumOfSquares: differenceSquares })
  const subjectSquares = total(points, (g) => g.sumTotalSquares)
  const sumOfSquares = (subjectSquares + differenceSquares) / 2
  const icc = iccOneWayFromSums({ n, k: 2, sum: total(points, (g) => g.sumTotal), sumOfSquares, sumOfSubjectSquares: subjectSquares })
  return {
    blandAltman: ba.ok ? { bias: ba.bias, sd: ba.sd, loa: ba.loa, biasCi: ba.biasCi, loaCi: ba.loaCi } : unavailable(ba.reason),
    icc: icc.ok ? { value: icc.value, ci: icc.ci } : unavailable(icc.reason),
  }
}

function pointStatistics(points: readonly PairGroup[], n: number, isAttending: (id: string) => boolean) {
  const count = total(points, (g) => g.n)
  if (count >= MIN_PAIRS) return heightStatistics(points, isAttending)
  const few = count === 0 ? 'none' : 'only 1'
  const reason = unavailable(`Needs at least ${MIN_PAIRS} pairs with a measured height on both sides; ${few} of the ${n} pairs has`)
  return { blandAltman: reason, icc: reason }
}

/** Bland–Altman, ICC(1,1) and kappas over the groups of pairs, in the difference's order, with what each left out. */
export function summarize(groups: readonly PairGroup[], examiners: Map<string, Examiner>, focus?: string): AgreementSummary {
  const isAttending = (id: string) => examiners.get(id)?.role === 'attending'
  const n = total(groups, (g) => g.n)
  const points = groups.filter(isPointGroup)
  const rows = byExaminer(points, examiners, focus)
  const elevated = kappaElevatedOf(groups, isAttending)
  const category = kappaCategoryOf(groups, isAttending)
  const heightsLeftOut = { n: n - total(points, (g) => g.n), reason: HEIGHTS_LEFT_OUT }
  const leftOut = { heights: heightsLeftOut, kappaElevated: elevated.leftOut, kappaCategory: category.leftOut }
  if (n < MIN_PAIRS) {
    const reason = unavailable(`Needs at least ${MIN_PAIRS} pairs; ${n === 0 ? 'none match' : 'only 1 matches'}`)
    return { n, blandAltman: reason, icc: reason, kappaElevated: reason, kappaCategory: reason, byExaminer: rows, leftOut }
  }
  const { blandAltman, icc } = pointStatistics(points, n, isAttending)
  return { n, blandAltman, icc, kappaElevated: elevated.kappa, kappaCategory: category.kappa, byExaminer: rows, leftOut }
}

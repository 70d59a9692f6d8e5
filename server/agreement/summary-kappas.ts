import { cohenKappa, landisKoch, weightedKappa } from '#shared/stats/index'
import type { AgreementSummary } from '#shared/schemas/agreement'
import type { PairGroup } from './pair-groups.ts'
import { flips } from './pairs.ts'
import { CATEGORY_SCALE, ELEVATED_ABOVE_CM } from './reading-categories.ts'
import type { Side } from './reading-levels-sql.ts'

const unavailable = (reason: string) => ({ unavailable: reason })
const MIN_PAIRS = 2

/** Fewer than two pairs left to count: the reason, in the words of what they lacked. */
const tooFew = (counted: number, what: string) =>
  counted < MIN_PAIRS ? unavailable(`Needs at least ${MIN_PAIRS} pairs ${what}; ${counted === 0 ? 'none has' : 'only 1 has'}`) : null

/** A group's level on one side for a k-level scale, or null when that reading (a bound) does not decide one. */
type Level = (g: PairGroup, side: Side) => number | null

/**
 * k×k counts over the groups whose two readings both decide a level, rows the first reading's in the difference's
 * order (so an attending who examined first is the column), and how many pairs did not decide.
 */
function table(groups: readonly PairGroup[], level: Level, k: number, isAttending: (id: string) => boolean) {
  const counts = Array.from({ length: k }, () => new Array<number>(k).fill(0))
  let leftOut = 0
  for (const g of groups) {
    const [a, b] = [level(g, 'earlier'), level(g, 'later')]
    if (a === null || b === null) leftOut += g.n
    else if (flips(g.earlierExaminerId, g.laterExaminerId, isAttending)) counts[b]![a]! += g.n
    else counts[a]![b]! += g.n
  }
  return { counts, leftOut, n: groups.reduce((sum, g) => sum + g.n, 0) }
}

const elevatedLevel: Level = (g, side) => g[`${side}Elevated`]
const categoryLevel: Level = (g, side) => g[`${side}Category`]

export const ELEVATED_LEFT_OUT =
  `A column top above the neck at or below ${ELEVATED_ABOVE_CM} cm: a lower bound that cannot say whether the JVP is elevated`
export const CATEGORY_LEFT_OUT =
  'A bound that reaches more than one category: above the neck with its limit not above the high threshold, ' +
  'or not filled with its limit not below the low threshold'

/** Cohen's kappa for elevated / not elevated (McGee 1998, Am Heart J 136:10–18), bounds counted where they decide. */
export function kappaElevatedOf(groups: readonly PairGroup[], isAttending: (id: string) => boolean) {
  const { counts, leftOut, n } = table(groups, elevatedLevel, 2, isAttending)
  const r = cohenKappa(counts)
  const kappa: AgreementSummary['kappaElevated'] =
    tooFew(n - leftOut, 'whose two readings both say whether the JVP is elevated') ??
    (r.ok ? { value: r.value, label: landisKoch(r.value) } : unavailable(r.reason))
  return { kappa, leftOut: { n: leftOut, reason: ELEVATED_LEFT_OUT } }
}

function weightedOf(counts: number[][]): AgreementSummary['kappaCategory'] {
  const linear = weightedKappa(counts, 'linear')
  const quadratic = weightedKappa(counts, 'quadratic')
  if (!linear.ok) return unavailable(linear.reason)
  if (!quadratic.ok) return unavailable(quadratic.reason)
  return { linear: linear.value, quadratic: quadratic.value, label: landisKoch(linear.value) }
}

/** Linear and quadratic weighted kappa over the category scale (Cook 1990), bounds counted where they decide. */
export function kappaCategoryOf(groups: readonly PairGroup[], isAttending: (id: string) => boolean) {
  const { counts, leftOut, n } = table(groups, categoryLevel, CATEGORY_SCALE.length, isAttending)
  const kappa = tooFew(n - leftOut, 'whose two readings both decide one category') ?? weightedOf(counts)
  return { kappa, leftOut: { n: leftOut, reason: CATEGORY_LEFT_OUT } }
}

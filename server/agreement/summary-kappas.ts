import { cohenKappa, landisKoch, weightedKappa } from '#shared/stats/index'
import type { AgreementSummary } from '#shared/schemas/agreement'
import type { Pair, Reading } from './pairs.ts'
import { CATEGORY_SCALE, decidedCategory, ELEVATED_ABOVE_CM, elevatedOfReading } from './reading-categories.ts'

const unavailable = (reason: string) => ({ unavailable: reason })
const MIN_PAIRS = 2

/** Fewer than two pairs left to count: the reason, in the words of what they lacked. */
const tooFew = (counted: number, what: string) =>
  counted < MIN_PAIRS ? unavailable(`Needs at least ${MIN_PAIRS} pairs ${what}; ${counted === 0 ? 'none has' : 'only 1 has'}`) : null

/** The level of a reading on a k-level scale, or null when the reading (a bound) does not decide one. */
type Level = (r: Reading) => number | null

/** k×k counts over the pairs whose two readings both decide a level (rows the first's), and how many did not. */
function table(pairs: readonly Pair[], level: Level, k: number): { counts: number[][]; leftOut: number } {
  const counts = Array.from({ length: k }, () => new Array<number>(k).fill(0))
  let leftOut = 0
  for (const { first, second } of pairs) {
    const [a, b] = [level(first), level(second)]
    if (a === null || b === null) leftOut += 1
    else counts[a]![b]! += 1
  }
  return { counts, leftOut }
}

const elevatedLevel: Level = (r) => {
  const elevated = elevatedOfReading(r)
  return elevated === null ? null : elevated ? 1 : 0
}

const categoryLevel: Level = (r) => {
  const category = decidedCategory(r)
  return category === null ? null : CATEGORY_SCALE.indexOf(category)
}

export const ELEVATED_LEFT_OUT =
  `A column top above the neck at or below ${ELEVATED_ABOVE_CM} cm: a lower bound that cannot say whether the JVP is elevated`
export const CATEGORY_LEFT_OUT =
  'A bound that reaches more than one category: above the neck with its limit not above the high threshold, ' +
  'or not filled with its limit not below the low threshold'

/** Cohen's kappa for elevated / not elevated (McGee 1998, Am Heart J 136:10–18), bounds counted where they decide. */
export function kappaElevatedOf(pairs: readonly Pair[]) {
  const { counts, leftOut } = table(pairs, elevatedLevel, 2)
  const r = cohenKappa(counts)
  const kappa: AgreementSummary['kappaElevated'] =
    tooFew(pairs.length - leftOut, 'whose two readings both say whether the JVP is elevated') ??
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
export function kappaCategoryOf(pairs: readonly Pair[]) {
  const { counts, leftOut } = table(pairs, categoryLevel, CATEGORY_SCALE.length)
  const kappa = tooFew(pairs.length - leftOut, 'whose two readings both decide one category') ?? weightedOf(counts)
  return { kappa, leftOut: { n: leftOut, reason: CATEGORY_LEFT_OUT } }
}

import { meanSquares } from './icc-anova.ts'
import { fLimits, single } from './icc-limits.ts'
import { degenerate, type Interval, type StatResult } from './result.ts'
import { assertRectangular } from './validate.ts'

/** ICC(1,1) with its 95% CI and the one-way analysis of variance behind it. */
export type IccOneWay = StatResult<{
  n: number
  k: number
  value: number
  ci: Interval
  /** Between subjects, n − 1 df. */
  msBetween: number
  /** Within subjects, n(k − 1) df. */
  msWithin: number
  /** MS_between / MS_within on `df`. */
  f: number
  df: [between: number, within: number]
}>

/**
 * ICC(1,1), the one-way random-effects, single-rater intraclass correlation (Shrout & Fleiss 1979, case 1, Psychol Bull
 * 86:420–428), with its F-based 95% CI as R's psych::ICC computes it. For ratings where each subject has its own set
 * of raters, such as routine pairs: rows are subjects, columns their k readings in any order.
 */
export function iccOneWay(ratings: readonly (readonly number[])[]): IccOneWay {
  const k = assertRectangular(ratings, 'ratings')
  const n = ratings.length
  if (n < 2) return degenerate('Needs at least 2 subjects')
  if (k < 2) return degenerate('Needs at least 2 ratings per subject')
  const ms = meanSquares(ratings)
  if (ms.totalSumOfSquares === 0) return degenerate('All ratings are identical')
  if (ms.rows === 0) return degenerate('Subjects do not differ, so the ICC is undefined')

  return iccOneWayOf(n, k, ms.rows, ms.within)
}

/** ICC(1,1) and its F-based 95% CI from the one-way mean squares of n subjects × k ratings (MS_between > 0). */
export function iccOneWayOf(n: number, k: number, msBetween: number, msWithin: number): IccOneWay {
  const df: [number, number] = [n - 1, n * (k - 1)]
  const f = msWithin === 0 ? Infinity : msBetween / msWithin
  const [low, high] = msWithin === 0 ? [Infinity, Infinity] : fLimits(f, df[0], df[1])
  const value = (msBetween - msWithin) / (msBetween + (k - 1) * msWithin)
  return { ok: true, n, k, value, ci: [single(low, k), single(high, k)], msBetween, msWithin, f, df }
}

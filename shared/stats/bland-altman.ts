import { tQuantile } from './quantiles.ts'
import { degenerate, StatsInputError, type Interval, type StatResult } from './result.ts'
import { assertFinite, sum } from './validate.ts'

/** Bland–Altman summary of paired differences a − b. */
export type BlandAltman = StatResult<{
  n: number
  /** Mean difference a − b. */
  bias: number
  /** Sample SD of the differences (n − 1 denominator). */
  sd: number
  /** 95% limits of agreement, bias ± 1.96·sd. */
  loa: Interval
  /** t-based 95% CI of the bias. */
  biasCi: Interval
  /** 95% CI of each limit of agreement. */
  loaCi: { lower: Interval; upper: Interval }
}>

const Z_975 = 1.96

/**
 * Bias, limits of agreement and their 95% CIs for two methods measured on the same subjects
 * (Bland & Altman 1986, Lancet i:307–310). Differences are `a[i] − b[i]`.
 */
export function blandAltman(a: readonly number[], b: readonly number[]): BlandAltman {
  if (a.length !== b.length) throw new StatsInputError(`a and b must pair up: ${a.length} vs ${b.length} values`)
  assertFinite(a, 'a')
  assertFinite(b, 'b')
  const n = a.length
  if (n < 2) return degenerate('Needs at least 2 pairs')

  const diffs = a.map((v, i) => v - b[i]!)
  const bias = sum(diffs) / n
  const sd = Math.sqrt(sum(diffs.map((d) => (d - bias) ** 2)) / (n - 1))
  return blandAltmanOf(n, bias, sd)
}

/**
 * The limits of agreement and the CIs of n ≥ 2 differences with mean `bias` and sample SD `sd` (Bland & Altman 1986,
 * Lancet i:307–310): each limit's CI uses SE ≈ √(3·sd²/n) and t with n − 1 df.
 */
export function blandAltmanOf(n: number, bias: number, sd: number): BlandAltman {
  const t = tQuantile(0.975, n - 1)
  const biasHalf = t * (sd / Math.sqrt(n))
  const limitHalf = t * Math.sqrt((3 * sd ** 2) / n)
  const low = bias - Z_975 * sd
  const high = bias + Z_975 * sd
  return {
    ok: true,
    n,
    bias,
    sd,
    loa: [low, high],
    biasCi: [bias - biasHalf, bias + biasHalf],
    loaCi: { lower: [low - limitHalf, low + limitHalf], upper: [high - limitHalf, high + limitHalf] },
  }
}

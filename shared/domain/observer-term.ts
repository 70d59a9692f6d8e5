import type { ObserverSource, ObserverTerm } from '../schemas/exam.ts'
import { chiSquareQuantile } from '../stats/quantiles.ts'
import { assertFinite } from '../stats/validate.ts'
import { withinSubjectMeanSquare } from '../stats/within-subject.ts'

/** Pairs or complete subjects a local term needs before it replaces the default (product default, no published source). */
export const LOCAL_TERM_MIN_N = 30
/** A local σ_exam is never taken below this (product default, no published source): small samples of careful examiners
 * would otherwise give a band narrower than bedside reading allows. */
export const EXAM_SIGMA_FLOOR_CM = 1.0

/**
 * σ with its 95% CI from a variance estimate on `df` degrees of freedom: σ·√(df/χ²_{0.975}) to σ·√(df/χ²_{0.025}).
 * The floor applies to the estimate and to both limits alike (a monotone map keeps the interval's coverage).
 */
function flooredTerm(source: ObserverSource, variance: number, df: number, n: number): ObserverTerm {
  const sigma = Math.sqrt(variance)
  const low = sigma * Math.sqrt(df / chiSquareQuantile(0.975, df))
  const high = sigma * Math.sqrt(df / chiSquareQuantile(0.025, df))
  const floor = (value: number) => Math.max(value, EXAM_SIGMA_FLOOR_CM)
  return { source, sigmaCm: floor(sigma), n, ci: [floor(low), floor(high)] }
}

/**
 * The per-exam error from routine pairs: each difference holds two examiners' reading and observer error, so
 * σ_exam = SD(d)/√2 on n − 1 df. Null below LOCAL_TERM_MIN_N pairs. Differences in cm, first minus second.
 */
export function localTermFromPairs(differencesCm: readonly number[]): ObserverTerm | null {
  assertFinite(differencesCm, 'differencesCm')
  const n = differencesCm.length
  if (n < LOCAL_TERM_MIN_N) return null
  const mean = differencesCm.reduce((total, d) => total + d, 0) / n
  const variance = differencesCm.reduce((total, d) => total + (d - mean) ** 2, 0) / (n - 1)
  return flooredTerm('local-pairs', variance / 2, n - 1, n)
}

/**
 * The per-exam error from closed calibration rounds: the pooled within-subject SD, √MS_within, on Σ(k − 1) df
 * (n(k − 1) when every subject has k examiners). Rows are complete subjects, their readings in cm, one per examiner.
 * Null below LOCAL_TERM_MIN_N subjects with at least two readings.
 */
export function localTermFromRounds(subjects: readonly (readonly number[])[]): ObserverTerm | null {
  const within = withinSubjectMeanSquare(subjects)
  if (within.subjects < LOCAL_TERM_MIN_N) return null
  return flooredTerm('local-rounds', within.meanSquare, within.df, within.subjects)
}

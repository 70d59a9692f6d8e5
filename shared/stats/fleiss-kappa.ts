import { degenerate, StatsInputError, type StatResult } from './result.ts'
import { assertCounts, sum } from './validate.ts'

export type FleissKappa = StatResult<{
  value: number
  subjects: number
  raters: number
  /** Mean agreement across subjects, P̄. */
  observed: number
  /** Chance agreement from the category proportions, P̄e. */
  expected: number
}>

/**
 * Fleiss' kappa (Fleiss 1971, Psychol Bull 76:378–382) from a subjects × categories table of counts:
 * `counts[i][j]` raters put subject i in category j. Every subject needs the same number of raters.
 */
export function fleissKappa(counts: readonly (readonly number[])[]): FleissKappa {
  const categories = assertCounts(counts, 'counts')
  const subjects = counts.length
  if (subjects === 0 || categories === 0) return degenerate('No ratings')
  const raters = sum(counts[0]!)
  const uneven = counts.findIndex((row) => sum(row) !== raters)
  if (uneven >= 0) {
    const other = sum(counts[uneven]!)
    throw new StatsInputError(`Every subject needs the same number of raters: row 0 has ${raters}, row ${uneven} has ${other}`)
  }
  if (raters < 2) return degenerate('Needs at least 2 raters per subject')

  const total = subjects * raters
  const proportions = Array.from({ length: categories }, (_, j) => sum(counts.map((row) => row[j]!)) / total)
  const perSubject = counts.map((row) => (sum(row.map((c) => c * c)) - raters) / (raters * (raters - 1)))
  const observed = sum(perSubject) / subjects
  const expected = sum(proportions.map((p) => p * p))
  if (expected === 1) return degenerate('All ratings fall in a single category, so kappa is undefined')
  return { ok: true, value: (observed - expected) / (1 - expected), subjects, raters, observed, expected }
}

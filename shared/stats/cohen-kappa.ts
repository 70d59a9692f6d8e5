import { degenerate, type StatResult } from './result.ts'
import { assertSquareCounts, sum } from './validate.ts'

/** A kappa with the agreement it compares: observed and chance-expected proportions (weighted if so computed). */
export type Kappa = StatResult<{ value: number; n: number; observed: number; expected: number }>

/** Disagreement weight of rating row category i against column category j, 0 on the diagonal. */
export type DisagreementWeight = (i: number, j: number, k: number) => number

/**
 * Kappa of a k×k table with disagreement weights w: κ = 1 − Σw·p_obs / Σw·p_chance.
 * Agreement proportions are reported as 1 − weighted disagreement.
 */
export function kappaFromTable(table: readonly (readonly number[])[], weight: DisagreementWeight): Kappa {
  const k = assertSquareCounts(table, 'table')
  const n = sum(table.map((row) => sum(row)))
  if (n === 0) return degenerate('The table is empty')
  if (k < 2) return degenerate('Needs at least 2 categories')

  const rowTotals = table.map((row) => sum(row))
  const colTotals = Array.from({ length: k }, (_, j) => sum(table.map((row) => row[j]!)))
  let observed = 0
  let expected = 0
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) {
      const w = weight(i, j, k)
      observed += (w * table[i]![j]!) / n
      expected += (w * rowTotals[i]! * colTotals[j]!) / n ** 2
    }
  }
  if (expected === 0) return degenerate('All ratings fall in a single category, so kappa is undefined')
  return { ok: true, value: 1 - observed / expected, n, observed: 1 - observed, expected: 1 - expected }
}

const unweighted: DisagreementWeight = (i, j) => (i === j ? 0 : 1)

/**
 * Cohen's kappa (Cohen 1960) for two raters' k×k table of counts:
 * rows are rater A's category, columns rater B's, over the same ordered categories.
 */
export function cohenKappa(table: readonly (readonly number[])[]): Kappa {
  return kappaFromTable(table, unweighted)
}

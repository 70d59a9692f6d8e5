import { blandAltmanOf, type BlandAltman } from './bland-altman.ts'
import { degenerate } from './result.ts'
import { assertSums, deviationSquares } from './sums.ts'

/** The sufficient statistics of n paired differences d = a − b: what a database aggregate can return per group. */
export type DifferenceSums = {
  n: number
  /** Σd. */
  sum: number
  /** Σd². */
  sumOfSquares: number
}

/** The sums of the differences a[i] − b[i]. */
export function differenceSums(a: readonly number[], b: readonly number[]): DifferenceSums {
  let sum = 0
  let sumOfSquares = 0
  a.forEach((v, i) => {
    const d = v - b[i]!
    sum += d
    sumOfSquares += d * d
  })
  return { n: a.length, sum, sumOfSquares }
}

/**
 * {@link blandAltman} from the sums of the differences rather than the differences themselves (Bland & Altman 1986,
 * Lancet i:307–310): bias Σd/n, sd² = (Σd² − (Σd)²/n)/(n − 1). Sums of groups add up, so a database can return them per
 * group and the caller adds the groups it wants.
 */
export function blandAltmanFromSums({ n, sum, sumOfSquares }: DifferenceSums): BlandAltman {
  assertSums(n, { sum, sumOfSquares })
  if (n < 2) return degenerate('Needs at least 2 pairs')
  const bias = sum / n
  const sd = Math.sqrt(deviationSquares(sumOfSquares, sum * bias) / (n - 1))
  return blandAltmanOf(n, bias, sd)
}

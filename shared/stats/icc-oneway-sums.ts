import { iccOneWayOf, type IccOneWay } from './icc-oneway.ts'
import { degenerate } from './result.ts'
import { assertSums, deviationSquares } from './sums.ts'

/** The sufficient statistics of an n × k ratings matrix for the one-way analysis of variance. */
export type RatingSums = {
  /** Subjects (rows). */
  n: number
  /** Ratings per subject (columns). */
  k: number
  /** Σx over every rating. */
  sum: number
  /** Σx² over every rating. */
  sumOfSquares: number
  /** Σ over subjects of the square of the subject's own Σx. */
  sumOfSubjectSquares: number
}

/** The sums of a rectangular ratings matrix, rows subjects. */
export function ratingSums(ratings: readonly (readonly number[])[]): RatingSums {
  let sum = 0
  let sumOfSquares = 0
  let sumOfSubjectSquares = 0
  for (const row of ratings) {
    let subject = 0
    for (const x of row) {
      subject += x
      sumOfSquares += x * x
    }
    sum += subject
    sumOfSubjectSquares += subject * subject
  }
  return { n: ratings.length, k: ratings[0]?.length ?? 0, sum, sumOfSquares, sumOfSubjectSquares }
}

/**
 * {@link iccOneWay}, ICC(1,1) (Shrout & Fleiss 1979, case 1, Psychol Bull 86:420–428), from the sums of the ratings:
 * SS_total = Σx² − (Σx)²/nk, SS_between = Σ(subject sums)²/k − (Σx)²/nk, SS_within = Σx² − Σ(subject sums)²/k.
 * Gives the same reasons as the per-rating function when no ICC can be given.
 */
export function iccOneWayFromSums({ n, k, sum, sumOfSquares, sumOfSubjectSquares }: RatingSums): IccOneWay {
  assertSums(n, { k, sum, sumOfSquares, sumOfSubjectSquares })
  if (n < 2) return degenerate('Needs at least 2 subjects')
  if (k < 2) return degenerate('Needs at least 2 ratings per subject')
  const correction = (sum * sum) / (n * k)
  const total = deviationSquares(sumOfSquares, correction)
  if (total === 0) return degenerate('All ratings are identical')
  const between = deviationSquares(sumOfSubjectSquares / k, correction)
  if (between === 0) return degenerate('Subjects do not differ, so the ICC is undefined')
  const within = deviationSquares(sumOfSquares, sumOfSubjectSquares / k)
  return iccOneWayOf(n, k, between / (n - 1), within / (n * (k - 1)))
}

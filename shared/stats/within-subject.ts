import { assertFinite } from './validate.ts'

/** The pooled within-subject mean square and what it rests on. */
export type WithinSubject = {
  /** Σ over subjects of Σ (x − subject mean)², divided by `df`. */
  meanSquare: number
  /** Σ (readings − 1) over the subjects used: n(k − 1) for a complete n×k matrix. */
  df: number
  /** Subjects with at least two readings. */
  subjects: number
}

function subjectSumOfSquares(readings: readonly number[]): number {
  let total = 0
  for (const x of readings) total += x
  const mean = total / readings.length
  let ss = 0
  for (const x of readings) ss += (x - mean) ** 2
  return ss
}

/**
 * MS_within of the one-way model (Shrout & Fleiss 1979, Psychol Bull 86:420–428): the pooled within-subject variance.
 * Rows are subjects, each with its readings; rows may differ in length (subjects of rounds with different numbers of
 * examiners pool the same way), and a row of fewer than two readings carries no within-subject information and is
 * skipped. `meanSquare` is NaN when no row has two readings.
 */
export function withinSubjectMeanSquare(rows: readonly (readonly number[])[]): WithinSubject {
  let ss = 0
  let df = 0
  let subjects = 0
  rows.forEach((row, i) => {
    assertFinite(row, `rows[${i}]`)
    if (row.length < 2) return
    ss += subjectSumOfSquares(row)
    df += row.length - 1
    subjects += 1
  })
  return { meanSquare: df === 0 ? Number.NaN : ss / df, df, subjects }
}

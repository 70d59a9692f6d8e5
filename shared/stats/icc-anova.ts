import { sum } from './validate.ts'

/** Mean squares of the two-way ANOVA without replication (subjects × raters). */
export type MeanSquares = {
  n: number
  k: number
  /** Between subjects (rows), n − 1 df. */
  rows: number
  /** Between raters (columns), k − 1 df. */
  columns: number
  /** Residual, (n − 1)(k − 1) df. */
  error: number
  /** Within subjects (columns + residual pooled), n(k − 1) df: the one-way model's error. */
  within: number
  totalSumOfSquares: number
}

// Sums of squares below this share of the total are rounding noise (e.g. identical raters whose
// means are not exactly representable); snapping them to 0 lets the exact-agreement limits apply.
const NOISE = 1e-12

/** Two-way ANOVA mean squares of a rectangular n×k matrix (n, k ≥ 2, already validated). */
export function meanSquares(x: readonly (readonly number[])[]): MeanSquares {
  const n = x.length
  const k = x[0]!.length
  const grand = sum(x.map((row) => sum(row))) / (n * k)
  const rowMeans = x.map((row) => sum(row) / k)
  const colMeans = Array.from({ length: k }, (_, j) => sum(x.map((row) => row[j]!)) / n)

  const total = sum(x.flatMap((row) => row.map((v) => (v - grand) ** 2)))
  const snap = (ss: number) => (ss <= NOISE * total ? 0 : ss)
  const ssRows = snap(k * sum(rowMeans.map((m) => (m - grand) ** 2)))
  const ssCols = snap(n * sum(colMeans.map((m) => (m - grand) ** 2)))
  const ssError = snap(
    sum(x.flatMap((row, i) => row.map((v, j) => (v - rowMeans[i]! - colMeans[j]! + grand) ** 2))),
  )

  return {
    n,
    k,
    rows: ssRows / (n - 1),
    columns: ssCols / (k - 1),
    error: ssError / ((n - 1) * (k - 1)),
    within: (ssCols + ssError) / (n * (k - 1)),
    totalSumOfSquares: total,
  }
}

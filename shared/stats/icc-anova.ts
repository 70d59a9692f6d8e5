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

function squaredDeviations(values: readonly number[], centre: number): number {
  let ss = 0
  for (const v of values) ss += (v - centre) ** 2
  return ss
}

// Plain loops rather than map/flatMap: the agreement summary runs this over 100,000 pairs per request.
function marginalMeans(x: readonly (readonly number[])[], k: number) {
  const rowMeans = new Array<number>(x.length)
  const colSums = new Array<number>(k).fill(0)
  let grandSum = 0
  x.forEach((row, i) => {
    let rowSum = 0
    for (let j = 0; j < k; j++) {
      rowSum += row[j]!
      colSums[j]! += row[j]!
    }
    rowMeans[i] = rowSum / k
    grandSum += rowSum
  })
  return { rowMeans, colMeans: colSums.map((s) => s / x.length), grand: grandSum / (x.length * k) }
}

/** Two-way ANOVA mean squares of a rectangular n×k matrix (n, k ≥ 2, already validated). */
export function meanSquares(x: readonly (readonly number[])[]): MeanSquares {
  const n = x.length
  const k = x[0]!.length
  const { rowMeans, colMeans, grand } = marginalMeans(x, k)
  let total = 0
  let residual = 0
  x.forEach((row, i) => {
    total += squaredDeviations(row, grand)
    for (let j = 0; j < k; j++) residual += (row[j]! - rowMeans[i]! - colMeans[j]! + grand) ** 2
  })
  const snap = (ss: number) => (ss <= NOISE * total ? 0 : ss)
  const ssRows = snap(k * squaredDeviations(rowMeans, grand))
  const ssCols = snap(n * squaredDeviations(colMeans, grand))
  const ssError = snap(residual)

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

import { StatsInputError } from './result.ts'

/**
 * A sum of squared deviations computed as Σx² − (Σx)²/n loses the digits it cancels: its rounding error is of the order
 * of 1e-16·Σx², and may even come out below 0. A value within this share of Σx² is that noise and is taken as 0, as
 * the per-value functions snap theirs (icc-anova.ts).
 */
const CANCELLATION_NOISE = 1e-12

/** A sum of squared deviations from its textbook form, never below 0 and 0 when it is only rounding noise. */
export function deviationSquares(sumOfSquares: number, correction: number): number {
  const ss = sumOfSquares - correction
  return ss <= CANCELLATION_NOISE * Math.abs(sumOfSquares) ? 0 : ss
}

/** Throws unless the count is a whole number ≥ 0 and every sum is finite. */
export function assertSums(count: number, sums: Record<string, number>): void {
  if (!Number.isInteger(count) || count < 0) throw new StatsInputError(`n must be a whole count, got ${count}`)
  for (const [name, value] of Object.entries(sums))
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new StatsInputError(`${name} must be a finite number, got ${String(value)}`)
}

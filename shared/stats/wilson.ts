import { degenerate, StatsInputError, type Interval, type StatResult } from './result.ts'

/** z for a two-sided 95% interval, Φ⁻¹(0.975). */
const Z_975 = 1.959963984540054

export type WilsonInterval = StatResult<{ share: number; ci: Interval }>

/**
 * The Wilson score interval for a binomial proportion `successes / n` (Wilson 1927, J Am Stat Assoc 22:209–212;
 * Newcombe 1998, Stat Med 17:857–872, method 3): unlike the simple ±z·SE interval it stays inside 0–1 and keeps
 * close to its nominal coverage for small n and shares near 0 or 1.
 */
export function wilsonInterval(successes: number, n: number, z = Z_975): WilsonInterval {
  if (!Number.isInteger(successes) || !Number.isInteger(n) || successes < 0 || successes > n)
    throw new StatsInputError(`successes must be a whole number from 0 to n, got ${successes} of ${n}`)
  if (n === 0) return degenerate('Needs at least 1 observation')
  const share = successes / n
  const z2 = z * z
  const centre = (2 * successes + z2) / (2 * (n + z2))
  const half = (z * Math.sqrt(z2 + 4 * successes * (1 - share))) / (2 * (n + z2))
  // At 0 or n successes the end is exactly 0 or 1 (the terms cancel); floating point would leave 1e-17 off.
  const low = successes === 0 ? 0 : Math.max(0, centre - half)
  const high = successes === n ? 1 : Math.min(1, centre + half)
  return { ok: true, share, ci: [low, high] }
}

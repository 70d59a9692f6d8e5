import type { Bound } from '../schemas/exam.ts'
import type { AccuracySummary } from '../schemas/reference.ts'
import { blandAltmanFromSums, differenceSums, type DifferenceSums } from '../stats/bland-altman-sums.ts'
import { wilsonInterval } from '../stats/wilson.ts'

/** A stored 95% band in cmH₂O: both ends for a point estimate, one end open (null) for a bound. */
export type StoredBand = readonly [number | null, number | null]

/** One estimate beside a contemporaneous measured pressure, both in cmH₂O. */
export interface AccuracyPair {
  estimateCmH2O: number
  referenceCmH2O: number
  band: StoredBand
}

/** What the band says: a point (both ends), a lower bound (only its low end), an upper bound (only its high end). */
export function boundOfBand(band: StoredBand): Exclude<Bound, 'none'> {
  if (band[0] !== null && band[1] !== null) return 'point'
  return band[0] !== null ? 'lower' : 'upper'
}

/**
 * Whether the measured value lies inside the stored 95% band, ends included. A bound's open side has no end, so a
 * lower bound holds every value at or above its limit and an upper bound every value at or below it.
 */
export function insideBand(band: StoredBand, referenceCmH2O: number): boolean {
  return (band[0] === null || referenceCmH2O >= band[0]) && (band[1] === null || referenceCmH2O <= band[1])
}

type Figures = Omit<AccuracySummary, 'points' | 'caution'>

/** What the accuracy figures need of the pairs, as sums a database aggregate can return. */
export interface AccuracySums {
  /** Σ and Σ² of estimate − reference over the point estimates (a bound has no difference to take). */
  differences: DifferenceSums
  /** Pairs whose measured value lies inside the stored band, and all pairs. */
  inside: number
  total: number
}

/** The sums of a list of pairs, as the database's aggregate adds them up. */
export function accuracySums(pairs: readonly AccuracyPair[]): AccuracySums {
  const points = pairs.filter((p) => boundOfBand(p.band) === 'point')
  const differences = differenceSums(
    points.map((p) => p.estimateCmH2O),
    points.map((p) => p.referenceCmH2O),
  )
  return { differences, inside: pairs.filter((p) => insideBand(p.band, p.referenceCmH2O)).length, total: pairs.length }
}

/**
 * Bland–Altman of estimate − reference over the point estimates (Bland & Altman 1986, Lancet i:307–310), and band
 * coverage over every pair with its Wilson 95% interval (Newcombe 1998, Stat Med 17:857–872, method 3). `n` counts the
 * point pairs, `coverage.n` every pair.
 */
export function accuracyFromSums({ differences, inside, total }: AccuracySums): Figures {
  const ba = blandAltmanFromSums(differences)
  const wilson = wilsonInterval(inside, total)
  return {
    n: differences.n,
    bias: ba.ok ? ba.bias : null,
    sd: ba.ok ? ba.sd : null,
    loa: ba.ok ? ba.loa : null,
    coverage: { inside, n: total, share: wilson.ok ? wilson.share : null, ci: wilson.ok ? wilson.ci : null },
  }
}

/** The accuracy figures of a list of pairs. */
export function accuracyFigures(pairs: readonly AccuracyPair[]): Figures {
  return accuracyFromSums(accuracySums(pairs))
}

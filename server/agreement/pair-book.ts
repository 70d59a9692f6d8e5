import { pairReadings, type Pair, type PairingOptions, type Reading } from './pairs.ts'

/**
 * The program's readings and their pairs, kept so that patients whose exams changed can be paired again on their own.
 * A book never changes: `with` answers a new one, so a request keeps the pairs it started with.
 */
export class PairBook {
  readonly readings: readonly Reading[]
  readonly pairs: readonly Pair[]

  private constructor(readings: readonly Reading[], pairs: readonly Pair[]) {
    this.readings = readings
    this.pairs = pairs
  }

  static of(readings: Reading[], options: PairingOptions): PairBook {
    return new PairBook(readings, pairReadings(readings, options))
  }

  /** A book in which the named patients hold exactly these readings, read again from the database, and their pairs. */
  with(patientCodes: readonly string[], readings: Reading[], options: PairingOptions): PairBook {
    const changed = new Set(patientCodes)
    const kept = this.readings.filter((r) => !changed.has(r.patientCode))
    const keptPairs = this.pairs.filter((p) => !changed.has(p.first.patientCode))
    return new PairBook(kept.concat(readings), keptPairs.concat(pairReadings(readings, options)))
  }
}

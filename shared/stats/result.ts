/** A closed interval `[low, high]`. */
export type Interval = [low: number, high: number]

/** Why a statistic is undefined for the data it was given; shown instead of a number. */
export type Degenerate = { ok: false; reason: string }

/** A statistic's values, or the reason they are undefined: never NaN. */
export type StatResult<T> = ({ ok: true } & T) | Degenerate

/** Builds the `{ ok: false, reason }` arm of a {@link StatResult}. */
export function degenerate(reason: string): Degenerate {
  return { ok: false, reason }
}

/** Malformed input (a caller's bug, e.g. a ragged matrix), as opposed to data a statistic cannot summarise. */
export class StatsInputError extends Error {
  constructor(message: string) {
    super(message)
    this.name = 'StatsInputError'
  }
}

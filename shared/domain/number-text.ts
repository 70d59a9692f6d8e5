import type { Estimate } from '../schemas/exam.ts'

/** One decimal place, the precision every figure in the note is given to. */
export function oneDp(value: number): string {
  return value.toFixed(1)
}

/** At most one decimal place, without a trailing ".0": 3 → "3", 4.7 → "4.7", 9.75 → "9.8". */
export function shortNumber(value: number): string {
  const rounded = Number(value.toFixed(1))
  return String(Object.is(rounded, -0) ? 0 : rounded)
}

/** The 95% band in words: "9.2–18.2", "at least 9.2" or "at most 14.2"; null when there is none. */
export function bandText(band: Estimate['bandCmH2O']): string | null {
  if (!band || (band[0] === null && band[1] === null)) return null
  if (band[1] === null) return `at least ${oneDp(band[0]!)}`
  if (band[0] === null) return `at most ${oneDp(band[1])}`
  return `${oneDp(band[0])}–${oneDp(band[1])}`
}

import type { InclinationBand, VeinFilter } from '#shared/schemas/agreement'

/** A number to `dp` decimals with a true minus sign, as the tables and captions print it. */
export function signed(value: number, dp = 1): string {
  const text = Math.abs(value).toFixed(dp)
  if (Number(text) === 0) return (0).toFixed(dp)
  return value < 0 ? `−${text}` : `+${text}`
}

/** Plain decimal with a true minus sign (no plus). */
export function decimal(value: number, dp = 1): string {
  return signed(value, dp).replace(/^\+/, '')
}

/** "−2.9 to +1.4": an interval in words, which reads better than a dash between negative numbers. */
export function interval([low, high]: readonly [number, number], dp = 1): string {
  return `${signed(low, dp)} to ${signed(high, dp)}`
}

export const BAND_LABEL: Record<InclinationBand, string> = {
  '0-29': 'Below 30° (0–29°)',
  '30-59': '30–59°',
  '60-90': '60° and above (60–90°)',
}

export const VEIN_FILTER_LABEL: Record<VeinFilter, string> = {
  internal: 'Internal jugular (either side)',
  external: 'External jugular (either side)',
  'right-internal': 'Right internal jugular',
  'left-internal': 'Left internal jugular',
  'right-external': 'Right external jugular',
  'left-external': 'Left external jugular',
}

/** A month key "2026-03" as "Mar 2026". */
export function monthLabel(month: string): string {
  const [year, m] = month.split('-').map(Number) as [number, number]
  return new Date(Date.UTC(year, m - 1, 1)).toLocaleDateString('en-GB', { month: 'short', year: 'numeric', timeZone: 'UTC' })
}

import { formatDate as formatDay, formatDateTime as formatTime, formatDateTimeZone } from '#shared/domain/date-time'
import { bandText, oneDp } from '#shared/domain/exam-note'
import type { Estimate } from '#shared/schemas/exam'

// The browser's own locale and zone: the reader's.
const READER = {}

/** An ISO time in the reader's own locale and zone, e.g. "14 Mar 2026, 09:30", or a dash. */
export function formatDateTime(iso: string | null | undefined): string {
  return iso ? formatTime(iso, READER) : '—'
}

/** An ISO time's calendar day in the reader's locale and zone, or a dash. */
export function formatDate(iso: string | null | undefined): string {
  return iso ? formatDay(iso, READER) : '—'
}

/** An ISO time with the zone it is read in, as a signature shows it, e.g. "14 Mar 2026, 09:30 GMT (Europe/London)". */
export function formatDateTimeWithZone(iso: string | null | undefined, timeZone?: string): string {
  return iso ? formatDateTimeZone(iso, { timeZone }) : '—'
}

/** A length or pressure to one decimal place, or a dash when there is none. */
/**
 * A whole count with a comma every three digits, as `toLocaleString('en')` writes it ("12,345"): without Intl, whose
 * first number format costs a phone's main thread tens of milliseconds of locale data before the log's first rows.
 */
export function formatCount(count: number): string {
  const whole = Math.trunc(count)
  const digits = String(Math.abs(whole)).replace(/\B(?=(\d{3})+(?!\d))/g, ',')
  return whole < 0 ? `-${digits}` : digits
}

export function formatOneDp(value: number | null | undefined): string {
  return value === null || value === undefined ? '—' : oneDp(value)
}

/** The 95% band in cmH₂O, with bound wording, or a dash. */
export function formatBand(band: Estimate['bandCmH2O']): string {
  return bandText(band) ?? '—'
}

/** The CVP as a table shows it: "13.7", "≥ 13.7", "≤ 9.7" or a dash. */
export function formatCvp(estimate: Estimate): string {
  if (estimate.cvpCmH2O === null) return '—'
  const prefix = estimate.bound === 'lower' ? '≥ ' : estimate.bound === 'upper' ? '≤ ' : ''
  return prefix + oneDp(estimate.cvpCmH2O)
}

/** Start of a local calendar day ("2026-03-14") as an ISO time, for the `from` filter. */
export function dayStartIso(day: string): string {
  return new Date(`${day}T00:00:00`).toISOString()
}

/** End of a local calendar day as an ISO time, for the `to` filter. */
export function dayEndIso(day: string): string {
  return new Date(`${day}T23:59:59.999`).toISOString()
}

/** The local calendar day ("2026-03-14") of an ISO time, for date inputs. */
export function isoToDay(iso: string | undefined): string {
  if (!iso) return ''
  const date = new Date(iso)
  const pad = (n: number) => String(n).padStart(2, '0')
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}`
}

/** A date-range filter's days as the `from`/`to` times it sends: the start of the first day, the end of the last. */
export function dayRange(fromDay: string, toDay: string): { from: string | undefined; to: string | undefined } {
  return { from: fromDay ? dayStartIso(fromDay) : undefined, to: toDay ? dayEndIso(toDay) : undefined }
}

/** Why a date range cannot be sent; empty when it can. */
export function dayRangeProblem(fromDay: string, toDay: string): string {
  return fromDay && toDay && toDay < fromDay ? 'The end is before the start' : ''
}

/** How a time is shown: the reader's locale (BCP 47 tag) and IANA zone; the runtime's own when omitted. */
export interface DateTimeStyle {
  locale?: string
  timeZone?: string
}

const UTC_NAMES = new Set(['UTC', 'Etc/UTC', 'Etc/GMT', 'GMT'])
const DATE = { day: 'numeric', month: 'short', year: 'numeric' } as const
// A 24-hour clock in every locale, so that a record never depends on reading "a.m." correctly (product default, no published source).
const TIME = { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' } as const
const cache = new Map<string, Intl.DateTimeFormat>()

function supported<T extends string>(value: T | undefined, check: (value: T) => void): T | undefined {
  if (value === undefined) return undefined
  try {
    check(value)
    return value
  } catch {
    return undefined
  }
}

/** The zone if the runtime knows it, else UTC; undefined stays undefined (the runtime's own zone). */
export function knownZone(timeZone: string | undefined): string | undefined {
  if (timeZone === undefined) return undefined
  return supported(timeZone, (zone) => new Intl.DateTimeFormat('en', { timeZone: zone })) ?? 'UTC'
}

function formatter(style: DateTimeStyle, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const locale = supported(style.locale, (tag) => Intl.getCanonicalLocales(tag))
  const timeZone = knownZone(style.timeZone)
  const key = JSON.stringify([locale, timeZone, options])
  let format = cache.get(key)
  if (!format) cache.set(key, (format = new Intl.DateTimeFormat(locale, { ...options, timeZone })))
  return format
}

const asDate = (value: Date | string) => (value instanceof Date ? value : new Date(value))

/** A calendar day, e.g. "14 Mar 2026" (en-GB) or "Mar 14, 2026" (en-US). */
export function formatDate(value: Date | string, style: DateTimeStyle = {}): string {
  return formatter(style, DATE).format(asDate(value))
}

/** A date and time on the 24-hour clock, e.g. "14 Mar 2026, 09:30" (en-GB). */
export function formatDateTime(value: Date | string, style: DateTimeStyle = {}): string {
  return formatter(style, { ...DATE, ...TIME }).format(asDate(value))
}

/**
 * A date and time with its zone, as a signature and anything sent outside the app must show it (21 CFR 11.50(a)(2)),
 * e.g. "14 Mar 2026, 09:30 GMT (Europe/London)"; UTC shows as "… UTC" alone.
 */
export function formatDateTimeZone(value: Date | string, style: DateTimeStyle = {}): string {
  const text = formatter(style, { ...DATE, ...TIME, timeZoneName: 'short' }).format(asDate(value))
  const zone = knownZone(style.timeZone) ?? new Intl.DateTimeFormat().resolvedOptions().timeZone
  return UTC_NAMES.has(zone) ? text : `${text} (${zone})`
}

// Building an Intl.DateTimeFormat costs far more than using one: both are kept (by zone, and by TZ for the default).
let defaultZone: { tz: string | undefined; zone: string } | undefined
const formatters = new Map<string, Intl.DateTimeFormat>()

/** The IANA zone the server runs in (the `TZ` environment variable, else the system's). */
export function serverTimeZone(): string {
  if (!defaultZone || defaultZone.tz !== process.env.TZ)
    defaultZone = { tz: process.env.TZ, zone: Intl.DateTimeFormat().resolvedOptions().timeZone }
  return defaultZone.zone
}

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let formatter = formatters.get(timeZone)
  if (!formatter) {
    const fields = { year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' } as const
    formatter = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', ...fields, timeZoneName: 'longOffset' })
    formatters.set(timeZone, formatter)
  }
  return formatter
}

/** ISO 8601 local time in the zone, with its offset, e.g. `2026-12-03T14:05:00.000+01:00`. */
export function isoInZone(date: Date, timeZone: string): string {
  const parts = formatterFor(timeZone).formatToParts(date)
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? ''
  const offset = part('timeZoneName').replace('GMT', '') || '+00:00'
  const ms = String(date.getUTCMilliseconds()).padStart(3, '0')
  return `${part('year')}-${part('month')}-${part('day')}T${part('hour')}:${part('minute')}:${part('second')}.${ms}${offset}`
}

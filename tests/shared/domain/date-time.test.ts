import { describe, expect, it } from 'vitest'
import { formatDate, formatDateTime, formatDateTimeZone, knownZone } from '#shared/domain/date-time'

// Expected texts follow CLDR's patterns for each locale (Unicode CLDR, as shipped in Node's full ICU).
const AT = '2026-07-14T08:30:00Z'

describe('formatDateTime', () => {
  it('writes the date and the 24-hour time in the reader locale and zone', () => {
    expect(formatDateTime(AT, { locale: 'en-GB', timeZone: 'Europe/London' })).toBe('14 Jul 2026, 09:30')
    expect(formatDateTime(AT, { locale: 'en-US', timeZone: 'America/New_York' })).toBe('Jul 14, 2026, 04:30')
    expect(formatDateTime(AT, { locale: 'de-DE', timeZone: 'Europe/Berlin' })).toBe('14. Juli 2026, 10:30')
  })

  it('when the locale tag is not valid, falls back to the runtime locale instead of throwing', () => {
    expect(formatDateTime(AT, { locale: 'not a locale!', timeZone: 'UTC' })).toBe(formatDateTime(AT, { timeZone: 'UTC' }))
  })
})

describe('formatDate', () => {
  it('writes the calendar day of the zone, which may differ from the UTC day', () => {
    expect(formatDate('2026-07-14T23:30:00Z', { locale: 'en-GB', timeZone: 'Asia/Tokyo' })).toBe('15 Jul 2026')
  })
})

describe('formatDateTimeZone', () => {
  it('adds the zone abbreviation and its IANA name, as a signature needs', () => {
    expect(formatDateTimeZone(AT, { locale: 'en-GB', timeZone: 'Europe/London' })).toBe('14 Jul 2026, 09:30 BST (Europe/London)')
  })

  it('shows UTC by its abbreviation alone', () => {
    expect(formatDateTimeZone(AT, { locale: 'en-GB', timeZone: 'UTC' })).toBe('14 Jul 2026, 08:30 UTC')
  })

  it('when the zone is unknown, writes the time in UTC', () => {
    expect(formatDateTimeZone(AT, { locale: 'en-GB', timeZone: 'Mars/Olympus' })).toBe('14 Jul 2026, 08:30 UTC')
  })
})

describe('knownZone', () => {
  it('keeps a known zone, replaces an unknown one by UTC and leaves an absent one absent', () => {
    expect([knownZone('Europe/Paris'), knownZone('Nowhere/Else'), knownZone(undefined)]).toEqual(['Europe/Paris', 'UTC', undefined])
  })
})

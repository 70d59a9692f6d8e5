import { describe, expect, it } from 'vitest'
import { isoInZone } from '../../../server/supervision/time-zone.ts'

describe('isoInZone', () => {
  it.each([
    ['Europe/Paris', '2026-12-03T14:05:00.250+01:00'],
    ['Europe/London', '2026-12-03T13:05:00.250+00:00'],
    ['UTC', '2026-12-03T13:05:00.250+00:00'],
    ['Asia/Kolkata', '2026-12-03T18:35:00.250+05:30'],
    ['America/New_York', '2026-12-03T08:05:00.250-05:00'],
  ])('writes the instant as local time in %s with its offset', (zone, expected) => {
    expect(isoInZone(new Date('2026-12-03T13:05:00.250Z'), zone)).toBe(expected)
  })

  it('follows daylight saving time', () => {
    expect(isoInZone(new Date('2026-07-01T12:00:00Z'), 'Europe/Paris')).toBe('2026-07-01T14:00:00.000+02:00')
  })

  it('names the same instant in every zone', () => {
    const instant = new Date('2026-03-29T01:30:00Z')

    expect(new Date(isoInZone(instant, 'Pacific/Auckland')).getTime()).toBe(instant.getTime())
  })
})

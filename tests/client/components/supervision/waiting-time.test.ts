import { describe, expect, it } from 'vitest'
import { waitedLong, waitingText } from '@/components/supervision/waiting-time'

describe('waitingText', () => {
  it.each([
    [30, 'under a minute'],
    [42 * 60, '42 min'],
    [5 * 3600 + 10 * 60, '5 h 10 min'],
    [3 * 86400 + 2 * 3600 + 59, '3 d 2 h'],
  ])('words %i seconds as "%s"', (seconds, text) => {
    expect(waitingText(seconds)).toBe(text)
  })
})

describe('waitedLong', () => {
  it('flags a day or more, not less', () => {
    expect(waitedLong(86_400)).toBe(true)
    expect(waitedLong(86_399)).toBe(false)
  })
})

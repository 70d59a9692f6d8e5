import { describe, expect, it } from 'vitest'
import { formatCount } from '@/utils/format'

// The reference is the platform's own: ECMA-402 Number.prototype.toLocaleString with the 'en' locale (CLDR grouping,
// a comma every three digits), which the function replaces on the exam log's first paint.
describe('formatCount', () => {
  it('groups digits as toLocaleString("en") does, for counts around each grouping step', () => {
    const counts = [0, 1, 9, 10, 99, 100, 999, 1_000, 1_001, 9_999, 10_000, 12_345, 99_999, 100_000, 999_999, 1_000_000, 1_234_567, 2 ** 31, -7, -1_234]
    for (const count of counts) expect(formatCount(count)).toBe(count.toLocaleString('en'))
  })

  it('writes a fraction as its whole part, as a count is whole', () => {
    expect(formatCount(10_000.9)).toBe('10,000')
  })
})

import { describe, expect, it } from 'vitest'
import { readTypedNumber } from '@/utils/typed-number'

describe('readTypedNumber', () => {
  it.each([
    ['2,5', 2.5],
    ['2.5', 2.5],
    [' 4 ', 4],
    ['-1,5', -1.5],
    ['−2', -2],
    ['+3', 3],
    [',5', 0.5],
    ['4.', 4],
    ['10,25', 10.25],
  ])('reads "%s" as %d', (typed, value) => {
    const result = readTypedNumber(typed)

    expect(result).toEqual({ value, error: null })
  })

  it('never reads a decimal comma as a thousands separator: "2,5" is not 25', () => {
    const result = readTypedNumber('2,5')

    expect(result.value).not.toBe(25)
  })

  it.each(['', '  ', '-', ',', '.', '-,'])('treats "%s" as not yet a number, without a message', (typed) => {
    const result = readTypedNumber(typed)

    expect(result).toEqual({ value: null, error: null })
  })

  it.each(['2,5,1', '1.2.3', '1.234,5', 'abc', '4cm', '2 5', '1e3', '--2', '0x1A'])('refuses "%s" with a message rather than guessing', (typed) => {
    const result = readTypedNumber(typed)

    expect(result.value).toBeNull()
    expect(result.error).toMatch(/Type a number such as 2\.5/)
  })
})

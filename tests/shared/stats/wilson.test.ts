import { describe, expect, it } from 'vitest'
import { StatsInputError } from '#shared/stats/result'
import { wilsonInterval } from '#shared/stats/wilson'
import { expectOk } from './helpers.ts'

describe('wilsonInterval', () => {
  // Newcombe 1998, Stat Med 17:857–872, Table I, method 3 (Wilson score interval without continuity correction).
  it.each([
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])('for %i of %i gives Newcombe’s published interval %f–%f', (successes, n, low, high) => {
    const { share, ci } = expectOk(wilsonInterval(successes, n))

    expect(share).toBeCloseTo(successes / n, 12)
    expect(ci[0]).toBeCloseTo(low, 4)
    expect(ci[1]).toBeCloseTo(high, 4)
  })

  it('is not symmetric about the share near 0, unlike the simple ±1.96·SE interval', () => {
    const { share, ci } = expectOk(wilsonInterval(15, 148))

    expect(share - ci[0]).toBeLessThan(ci[1] - share)
  })

  it('when every observation succeeds, ends at exactly 1', () => {
    const { ci } = expectOk(wilsonInterval(29, 29))

    expect(ci[1]).toBe(1)
    expect(ci[0]).toBeGreaterThan(0.88)
  })

  it('with no observations, gives a reason instead of numbers', () => {
    expect(wilsonInterval(0, 0)).toEqual({ ok: false, reason: 'Needs at least 1 observation' })
  })

  it('refuses more successes than observations', () => {
    expect(() => wilsonInterval(5, 4)).toThrow(StatsInputError)
  })
})

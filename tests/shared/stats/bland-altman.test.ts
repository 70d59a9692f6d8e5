import { describe, expect, it } from 'vitest'
import { blandAltman } from '#shared/stats/bland-altman'
import { StatsInputError } from '#shared/stats/result'
import { expectOk } from './helpers.ts'
import { PEAK_FLOW_1986 } from './reference-data.ts'

describe('blandAltman', () => {
  it('reproduces Bland & Altman 1986 peak-flow bias and SD', () => {
    const { wright, miniWright } = PEAK_FLOW_1986

    const result = expectOk(blandAltman(wright, miniWright))

    // Bland & Altman 1986 (Lancet i:307–310): mean difference −2.1, SD 38.8 l/min
    expect(result.bias).toBeCloseTo(-2.1, 1)
    expect(result.sd).toBeCloseTo(38.8, 1)
    // exact values of the same data
    expect(result.bias).toBeCloseTo(-2.117647, 6)
    expect(result.sd).toBeCloseTo(38.76513, 5)
    expect(result.n).toBe(17)
  })

  it('gives limits bias ± 1.96·SD and t-based CIs with SE √(sd²/n) for the bias and √(3·sd²/n) for each limit', () => {
    const { wright, miniWright } = PEAK_FLOW_1986

    const { bias, sd, loa, biasCi, loaCi } = expectOk(blandAltman(wright, miniWright))

    // t(0.975, 16 df) = 2.120 from any printed t table; Bland & Altman 1986 use the same SEs
    const t = 2.12
    const seLimit = Math.sqrt((3 * sd ** 2) / 17)
    expect(loa[0]).toBeCloseTo(bias - 1.96 * sd, 10)
    expect(loa[1]).toBeCloseTo(bias + 1.96 * sd, 10)
    expect(biasCi[0]).toBeCloseTo(bias - (t * sd) / Math.sqrt(17), 2)
    expect(biasCi[1]).toBeCloseTo(bias + (t * sd) / Math.sqrt(17), 2)
    expect(loaCi.lower[0]).toBeCloseTo(loa[0] - t * seLimit, 2)
    expect(loaCi.lower[1]).toBeCloseTo(loa[0] + t * seLimit, 2)
    expect(loaCi.upper[0]).toBeCloseTo(loa[1] - t * seLimit, 2)
    expect(loaCi.upper[1]).toBeCloseTo(loa[1] + t * seLimit, 2)
  })

  it('takes the difference as a − b, so a negative bias means a reads lower', () => {
    const a = [4, 5, 6]
    const b = [5, 6, 8]

    const result = expectOk(blandAltman(a, b))

    expect(result.bias).toBeCloseTo(-4 / 3, 12)
  })

  it.each([
    [[], []],
    [[5], [4]],
  ])('with %j vs %j, explains that it needs at least 2 pairs', (a, b) => {
    const result = blandAltman(a, b)

    expect(result).toEqual({ ok: false, reason: 'Needs at least 2 pairs' })
  })

  it('with identical differences, reports SD 0 and collapsed intervals rather than NaN', () => {
    const a = [10, 12, 14]
    const b = [9, 11, 13]

    const result = expectOk(blandAltman(a, b))

    expect(result.sd).toBe(0)
    expect(result.loa).toEqual([1, 1])
    expect(result.biasCi).toEqual([1, 1])
    expect(result.loaCi).toEqual({ lower: [1, 1], upper: [1, 1] })
  })

  it('rejects unpaired or non-finite input', () => {
    expect(() => blandAltman([1, 2, 3], [1, 2])).toThrow(StatsInputError)
    expect(() => blandAltman([1, Number.NaN], [1, 2])).toThrow(/a\[1\] must be a finite number/)
  })
})

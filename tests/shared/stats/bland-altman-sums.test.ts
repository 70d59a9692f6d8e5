import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { blandAltman } from '#shared/stats/bland-altman'
import { blandAltmanFromSums, differenceSums } from '#shared/stats/bland-altman-sums'
import { StatsInputError } from '#shared/stats/result'
import { expectOk } from './helpers.ts'
import { PEAK_FLOW_1986 } from './reference-data.ts'

/** Heights as recorded at the bedside: −5 to 20 cm in half centimetres. */
const height = fc.integer({ min: -10, max: 40 }).map((half) => half / 2)
const pairsOf = (min: number) => fc.array(fc.tuple(height, height), { minLength: min, maxLength: 200 })

describe('blandAltmanFromSums', () => {
  it('reproduces Bland & Altman 1986 peak-flow bias and SD from n, Σd and Σd²', () => {
    const { wright, miniWright } = PEAK_FLOW_1986

    const result = expectOk(blandAltmanFromSums(differenceSums(wright, miniWright)))

    // Bland & Altman 1986 (Lancet i:307–310): mean difference −2.1, SD 38.8 l/min; exact values of the same data
    expect(result.bias).toBeCloseTo(-2.117647, 6)
    expect(result.sd).toBeCloseTo(38.76513, 5)
    expect(result.n).toBe(17)
  })

  it('gives what the per-pair function gives on the same pairs: bias, SD, limits and every CI', () => {
    fc.assert(
      fc.property(pairsOf(2), (pairs) => {
        const [a, b] = [pairs.map((p) => p[0]), pairs.map((p) => p[1])]

        const fromSums = blandAltmanFromSums(differenceSums(a, b))

        const perPair = blandAltman(a, b)
        expect(fromSums.ok).toBe(true)
        if (!fromSums.ok || !perPair.ok) return
        const close = (x: number, y: number) => expect(Math.abs(x - y)).toBeLessThan(1e-9 * Math.max(1, Math.abs(y)))
        close(fromSums.bias, perPair.bias)
        close(fromSums.sd, perPair.sd)
        ;[...fromSums.loa, ...fromSums.biasCi, ...fromSums.loaCi.lower, ...fromSums.loaCi.upper].forEach((x, i) =>
          close(x, [...perPair.loa, ...perPair.biasCi, ...perPair.loaCi.lower, ...perPair.loaCi.upper][i]!),
        )
      }),
    )
  })

  it('adds up over groups: the sums of two groups give the figures of all their pairs', () => {
    const { wright, miniWright } = PEAK_FLOW_1986
    const [first, second] = [differenceSums(wright.slice(0, 8), miniWright.slice(0, 8)), differenceSums(wright.slice(8), miniWright.slice(8))]

    const joined = expectOk(blandAltmanFromSums({ n: first.n + second.n, sum: first.sum + second.sum, sumOfSquares: first.sumOfSquares + second.sumOfSquares }))

    expect(joined.bias).toBeCloseTo(-2.117647, 6)
    expect(joined.sd).toBeCloseTo(38.76513, 5)
  })

  it('with identical differences, reports SD 0 and collapsed intervals, as the per-pair function does', () => {
    const result = expectOk(blandAltmanFromSums(differenceSums([10, 12, 14], [9, 11, 13])))

    expect(result.sd).toBe(0)
    expect(result.loa).toEqual([1, 1])
    expect(result.loaCi).toEqual({ lower: [1, 1], upper: [1, 1] })
  })

  it('takes SD 0 when the cancellation in Σd² − (Σd)²/n leaves only rounding noise, never NaN', () => {
    const d = Array.from({ length: 7 }, () => 0.1)

    const result = expectOk(blandAltmanFromSums(differenceSums(d, d.map(() => 0))))

    expect(result.sd).toBe(0)
  })

  it.each([
    [{ n: 0, sum: 0, sumOfSquares: 0 }],
    [{ n: 1, sum: 2, sumOfSquares: 4 }],
  ])('with %j, explains that it needs at least 2 pairs', (sums) => {
    expect(blandAltmanFromSums(sums)).toEqual({ ok: false, reason: 'Needs at least 2 pairs' })
  })

  it('rejects a count that is not whole or a sum that is not finite', () => {
    expect(() => blandAltmanFromSums({ n: 2.5, sum: 1, sumOfSquares: 1 })).toThrow(StatsInputError)
    expect(() => blandAltmanFromSums({ n: 3, sum: Number.NaN, sumOfSquares: 1 })).toThrow(/sum must be a finite number/)
  })
})

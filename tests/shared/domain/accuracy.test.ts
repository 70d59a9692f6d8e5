import { describe, expect, it } from 'vitest'
import { accuracyFigures, boundOfBand, insideBand, type AccuracyPair } from '#shared/domain/accuracy'

describe('insideBand', () => {
  it.each([
    ['the low end of a point band', [9.2, 18.2], 9.2, true],
    ['the high end of a point band', [9.2, 18.2], 18.2, true],
    ['just below a point band', [9.2, 18.2], 9.19, false],
    ['just above a point band', [9.2, 18.2], 18.21, false],
    ['a lower bound’s limit', [10, null], 10, true],
    ['far above a lower bound (its open side)', [10, null], 30, true],
    ['below a lower bound', [10, null], 9.9, false],
    ['an upper bound’s limit', [null, 6.5], 6.5, true],
    ['far below an upper bound (its open side)', [null, 6.5], -2, true],
    ['above an upper bound', [null, 6.5], 6.6, false],
  ] as const)('a reference at %s is inside: %s', (_case, band, reference, inside) => {
    expect(insideBand(band, reference)).toBe(inside)
  })

  it('names the band’s kind by its open side', () => {
    expect([boundOfBand([1, 2]), boundOfBand([1, null]), boundOfBand([null, 2])]).toEqual(['point', 'lower', 'upper'])
  })
})

describe('accuracyFigures', () => {
  const pairs: AccuracyPair[] = [
    { estimateCmH2O: 13.7, referenceCmH2O: 12, band: [9.2, 18.2] }, // d = +1.7, inside
    { estimateCmH2O: 10, referenceCmH2O: 14, band: [5.5, 14.5] }, // d = −4, inside
    { estimateCmH2O: 8, referenceCmH2O: 15, band: [3.5, 12.5] }, // d = −7, outside
    { estimateCmH2O: 20, referenceCmH2O: 25, band: [16, null] }, // lower bound, inside on its open side
    { estimateCmH2O: 5, referenceCmH2O: 8, band: [null, 6.6] }, // upper bound, outside
  ]

  it('takes estimate − reference over the point estimates only: bias, SD and 95% limits by hand', () => {
    const figures = accuracyFigures(pairs)

    // d = 1.7, −4, −7: mean −3.1; squared deviations 23.04 + 0.81 + 15.21 = 39.06; SD = √(39.06 / 2) = 4.419276.
    expect(figures.n).toBe(3)
    expect(figures.bias).toBeCloseTo(-3.1, 10)
    expect(figures.sd).toBeCloseTo(4.419276, 6)
    // −3.1 ± 1.96 × 4.419276
    expect(figures.loa![0]).toBeCloseTo(-11.761781, 5)
    expect(figures.loa![1]).toBeCloseTo(5.561781, 5)
  })

  it('counts coverage over every pair, bounds included, with the Wilson 95% interval', () => {
    const { coverage } = accuracyFigures(pairs)

    // 3 of 5 inside. Wilson: centre (6 + z²)/(2(5 + z²)) = 0.55655, half-width z√(z² + 4·3·0.4)/(2(5 + z²)) = 0.32584.
    expect(coverage).toMatchObject({ inside: 3, n: 5, share: 0.6 })
    expect(coverage.ci![0]).toBeCloseTo(0.2307, 4)
    expect(coverage.ci![1]).toBeCloseTo(0.8824, 4)
  })

  it('without pairs, gives nulls rather than numbers', () => {
    expect(accuracyFigures([])).toEqual({ n: 0, bias: null, sd: null, loa: null, coverage: { inside: 0, n: 0, share: null, ci: null } })
  })

  it('with one point pair, gives coverage but no limits of agreement', () => {
    const figures = accuracyFigures([pairs[0]!])

    expect(figures).toMatchObject({ n: 1, bias: null, sd: null, loa: null, coverage: { inside: 1, n: 1, share: 1 } })
  })
})

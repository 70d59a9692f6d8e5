import { describe, expect, it } from 'vitest'
import { landisKoch } from '#shared/stats/landis-koch'
import { StatsInputError } from '#shared/stats/result'

describe('landisKoch', () => {
  // Landis & Koch 1977 (Biometrics 33:159–174), on the half-open intervals of PRODUCT.md §6
  it.each([
    [-0.01, 'poor'],
    [0, 'slight'],
    [0.1999, 'slight'],
    [0.2, 'fair'],
    [0.3999, 'fair'],
    [0.4, 'moderate'],
    [0.5999, 'moderate'],
    [0.6, 'substantial'],
    [0.7999, 'substantial'],
    [0.8, 'almost perfect'],
    [1, 'almost perfect'],
  ])('labels %d as %s', (kappa, label) => {
    const result = landisKoch(kappa)

    expect(result).toBe(label)
  })

  it.each([1.01, Number.NaN, Number.POSITIVE_INFINITY])('rejects %d, which no kappa can be', (kappa) => {
    expect(() => landisKoch(kappa)).toThrow(StatsInputError)
  })
})

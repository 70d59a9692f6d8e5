import { describe, expect, it } from 'vitest'
import { cohenKappa } from '#shared/stats/cohen-kappa'
import { landisKoch } from '#shared/stats/landis-koch'
import { StatsInputError } from '#shared/stats/result'
import { expectOk } from './helpers.ts'

describe('landisKoch', () => {
  // Landis & Koch 1977 (Biometrics 33:159–174), Table: < 0 poor, 0.00–0.20 slight, 0.21–0.40 fair, 0.41–0.60
  // moderate, 0.61–0.80 substantial, 0.81–1.00 almost perfect: each band closed at the top.
  it.each([
    [-0.01, 'poor'],
    [0, 'slight'],
    [0.2, 'slight'],
    [0.2001, 'fair'],
    [0.4, 'fair'],
    [0.4001, 'moderate'],
    [0.6, 'moderate'],
    [0.6001, 'substantial'],
    [0.8, 'substantial'],
    [0.8001, 'almost perfect'],
    [1, 'almost perfect'],
  ])('labels %d as %s', (kappa, label) => {
    const result = landisKoch(kappa)

    expect(result).toBe(label)
  })

  it('labels a kappa of exactly 0.40, computed in floating point, as fair', () => {
    // 50 proposals, table [[20, 5], [10, 15]]: κ = (0.70 − 0.50) / (1 − 0.50) = 0.40
    const kappa = expectOk(cohenKappa([[20, 5], [10, 15]])).value

    expect(landisKoch(kappa)).toBe('fair')
    expect(landisKoch(0.4 + Number.EPSILON)).toBe('fair')
  })

  it.each([1.01, Number.NaN, Number.POSITIVE_INFINITY])('rejects %d, which no kappa can be', (kappa) => {
    expect(() => landisKoch(kappa)).toThrow(StatsInputError)
  })
})

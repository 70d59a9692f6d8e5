import { describe, expect, it } from 'vitest'
import { weightedKappa } from '#shared/stats/weighted-kappa'
import { crossTable, expectOk } from './helpers.ts'
import { IRR_ANXIETY, SAS_3X3 } from './reference-data.ts'

/** Weighted kappa straight from paired ratings on a 1..k scale: 1 − mean pair disagreement / mean cross-pair disagreement. */
function kappaFromRatings(a: number[], b: number[], k: number, power: 1 | 2): number {
  const w = (x: number, y: number) => (Math.abs(x - y) / (k - 1)) ** power
  const observed = a.reduce((s, x, i) => s + w(x, b[i]!), 0) / a.length
  const chance = a.reduce((s, x) => s + b.reduce((t, y) => t + w(x, y), 0), 0) / a.length ** 2
  return 1 - observed / chance
}

describe('weightedKappa', () => {
  it('reproduces the SAS 3×3 linear weighted kappa', () => {
    const table = SAS_3X3

    const result = expectOk(weightedKappa(table, 'linear'))

    // SAS output reproduced in statsmodels' test_inter_rater.py: Weighted Kappa 0.4701
    expect(result.value).toBeCloseTo(0.4701, 4)
  })

  it('gives the hand-computed quadratic weighted kappa of the SAS 3×3 table', () => {
    const table = SAS_3X3

    const result = expectOk(weightedKappa(table, 'quadratic'))

    // n = 19, rows 5/8/6, columns 0/13/6, weights 0, ¼, 1:
    // observed Σw·n = 4·¼ + 1·1 + 1·¼ = 2.25; chance Σw·r·c/n = (5·13·¼ + 5·6·1 + 8·6·¼ + 6·13·¼)/19 = 77.75/19
    expect(result.value).toBeCloseTo(1 - 2.25 / (77.75 / 19), 12)
    expect(result.value).toBeCloseTo(0.4502, 4)
  })

  it('reproduces R irr kappa2 "equal" and "squared" weights on the anxiety levels used', () => {
    const table = crossTable(IRR_ANXIETY.rater2, IRR_ANXIETY.rater3, [1, 2, 3, 4, 6])

    const linear = expectOk(weightedKappa(table, 'linear'))
    const quadratic = expectOk(weightedKappa(table, 'quadratic'))

    // R irr (which keeps only observed levels): kappa2(anxiety[,2:3], "equal") = 0.1459075,
    // "squared" = 0.2520325, as recorded in statsmodels' test_inter_rater.py
    expect(linear.value).toBeCloseTo(0.1459075, 7)
    expect(quadratic.value).toBeCloseTo(0.2520325, 7)
  })

  it('weighs distances over the declared scale, so an unused level still counts', () => {
    const { rater2, rater3 } = IRR_ANXIETY
    const declared = crossTable(rater2, rater3, [1, 2, 3, 4, 5, 6])

    const linear = expectOk(weightedKappa(declared, 'linear'))
    const quadratic = expectOk(weightedKappa(declared, 'quadratic'))

    // level 5 is never used, yet 4 → 6 is two steps of the 1–6 scale, unlike irr's observed-level result above
    expect(linear.value).toBeCloseTo(kappaFromRatings(rater2, rater3, 6, 1), 12)
    expect(quadratic.value).toBeCloseTo(kappaFromRatings(rater2, rater3, 6, 2), 12)
    expect(quadratic.value).not.toBeCloseTo(0.2520325, 4)
  })

  it('with every rating in one category, states why no kappa can be given', () => {
    const table = [
      [0, 0, 0],
      [0, 9, 0],
      [0, 0, 0],
    ]

    const result = weightedKappa(table, 'quadratic')

    expect(result).toEqual({ ok: false, reason: 'All ratings fall in a single category, so kappa is undefined' })
  })
})

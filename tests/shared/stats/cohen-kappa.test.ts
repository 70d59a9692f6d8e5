import { describe, expect, it } from 'vitest'
import { cohenKappa } from '#shared/stats/cohen-kappa'
import { StatsInputError } from '#shared/stats/result'
import { crossTable, expectOk } from './helpers.ts'
import { IRR_ANXIETY, SAS_3X3 } from './reference-data.ts'

describe('cohenKappa', () => {
  it('gives 0.40 for the 50 proposals', () => {
    const table = [
      [20, 5],
      [10, 15],
    ]

    const result = expectOk(cohenKappa(table))

    // 50 proposals, po = 0.70, pe = 0.50, κ = 0.40 (the worked example of Wikipedia's "Cohen's kappa")
    expect(result.value).toBeCloseTo(0.4, 10)
    expect(result.observed).toBeCloseTo(0.7, 10)
    expect(result.expected).toBeCloseTo(0.5, 10)
    expect(result.n).toBe(50)
  })

  it('reproduces the SAS 3×3 simple kappa', () => {
    const table = SAS_3X3

    const result = expectOk(cohenKappa(table))

    // SAS output reproduced in statsmodels' test_inter_rater.py: Simple Kappa 0.4842
    expect(result.value).toBeCloseTo(0.4842, 4)
  })

  it('reproduces R irr kappa2 for the anxiety data, raters 2 and 3', () => {
    const table = crossTable(IRR_ANXIETY.rater2, IRR_ANXIETY.rater3, [1, 2, 3, 4, 6])

    const result = expectOk(cohenKappa(table))

    // R irr: kappa2(anxiety[,2:3]) = -0.006289308, as recorded in statsmodels' test_inter_rater.py
    expect(result.value).toBeCloseTo(-0.006289308, 8)
  })

  it.each([
    [[], 'The table is empty'],
    [[[0, 0], [0, 0]], 'The table is empty'],
    [[[7]], 'Needs at least 2 categories'],
    [[[12, 0], [0, 0]], 'All ratings fall in a single category, so kappa is undefined'],
  ])('with %j, states why no kappa can be given', (table, reason) => {
    const result = cohenKappa(table)

    expect(result).toEqual({ ok: false, reason })
  })

  it.each([
    [[[1, -1], [0, 2]], /non-negative whole count/],
    [[[1, 0.5], [0, 2]], /non-negative whole count/],
    [[[1, 2, 3], [4, 5, 6]], /must be square/],
    [[[1, 2], [3]], /ragged/],
  ])('rejects the malformed table %j', (table, message) => {
    expect(() => cohenKappa(table)).toThrow(StatsInputError)
    expect(() => cohenKappa(table)).toThrow(message)
  })
})

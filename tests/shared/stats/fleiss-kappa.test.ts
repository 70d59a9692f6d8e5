import { describe, expect, it } from 'vitest'
import { fleissKappa } from '#shared/stats/fleiss-kappa'
import { StatsInputError } from '#shared/stats/result'
import { countsByCategory, expectOk } from './helpers.ts'
import { FLEISS_1971_DIAGNOSES, WIKIPEDIA_FLEISS } from './reference-data.ts'

describe('fleissKappa', () => {
  it('reproduces Fleiss 1971: 30 patients, 6 psychiatrists, 5 diagnoses', () => {
    const counts = countsByCategory(FLEISS_1971_DIAGNOSES, 5)

    const result = expectOk(fleissKappa(counts))

    // column totals of the count table, as checked in statsmodels' test_aggregate_raters
    expect(counts.reduce((t, row) => t.map((v, j) => v + row[j]!))).toEqual([26, 26, 30, 55, 43])
    // Fleiss 1971 (Psychol Bull 76:378–382) κ = .430; R irr kappam.fleiss(diagnoses) = 0.4302445
    expect(result.value).toBeCloseTo(0.4302, 4)
    expect(result.value).toBeCloseTo(0.4302445, 7)
    expect([result.subjects, result.raters]).toEqual([30, 6])
  })

  it("reproduces the worked example of Wikipedia's \"Fleiss' kappa\" article", () => {
    const counts = WIKIPEDIA_FLEISS

    const result = expectOk(fleissKappa(counts))

    // Wikipedia: κ = 0.210, also checked in statsmodels' test_fleiss_kappa. P̄ and P̄e re-run in base R
    // (Fleiss 1971's formulas, w = the count table, n = 14): mean((rowSums(w^2) - n) / (n * (n - 1))) = 0.378022,
    // sum((colSums(w) / sum(w))^2) = 0.212755, κ = 0.209931
    expect(result.observed).toBeCloseTo(0.378, 3)
    expect(result.expected).toBeCloseTo(0.213, 3)
    expect(result.value).toBeCloseTo(0.21, 3)
  })

  it.each([
    [[], 'No ratings'],
    [[[1, 0], [0, 1]], 'Needs at least 2 raters per subject'],
    [[[0, 3], [0, 3]], 'All ratings fall in a single category, so kappa is undefined'],
  ])('with %j, states why no kappa can be given', (counts, reason) => {
    const result = fleissKappa(counts)

    expect(result).toEqual({ ok: false, reason })
  })

  it('rejects subjects rated by different numbers of raters', () => {
    const counts = [
      [2, 1],
      [1, 1],
    ]

    expect(() => fleissKappa(counts)).toThrow(/same number of raters: row 0 has 3, row 1 has 2/)
  })

  it('rejects negative counts', () => {
    expect(() => fleissKappa([[3, -1], [1, 1]])).toThrow(StatsInputError)
  })
})

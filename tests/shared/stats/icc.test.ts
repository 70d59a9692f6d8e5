import { describe, expect, it } from 'vitest'
import { icc } from '#shared/stats/icc'
import { StatsInputError } from '#shared/stats/result'
import { expectOk } from './helpers.ts'
import { SHROUT_FLEISS_1979 } from './reference-data.ts'

describe('icc', () => {
  it('reproduces the Shrout & Fleiss 1979 ICCs of their 6 × 4 example', () => {
    const ratings = SHROUT_FLEISS_1979

    const r = expectOk(icc(ratings))

    // Shrout & Fleiss 1979 (Psychol Bull 86:420–428)
    expect(r.icc1.value).toBeCloseTo(0.17, 2)
    expect(r.icc2.value).toBeCloseTo(0.29, 2)
    expect(r.icc3.value).toBeCloseTo(0.71, 2)
    expect(r.icc2k.value).toBeCloseTo(0.62, 2)
    // The remaining k-rater forms, re-run in R with sf = the 6 × 4 matrix above:
    // psych::ICC(sf, lmer = FALSE)$results → ICC1k 0.442797, ICC3k 0.909316
    expect(r.icc1k.value).toBeCloseTo(0.44, 2)
    expect(r.icc3k.value).toBeCloseTo(0.91, 2)
    expect([r.n, r.k]).toEqual([6, 4])
  })

  it('reproduces R psych::ICC for ICC(2,1) with the Satterthwaite CI', () => {
    const ratings = SHROUT_FLEISS_1979

    const { icc2 } = expectOk(icc(ratings))

    // R psych package, ICC(sf, lmer = FALSE)
    expect(icc2.value).toBeCloseTo(0.2897637795, 10)
    expect(icc2.ci[0]).toBeCloseTo(0.0188, 4)
    expect(icc2.ci[1]).toBeCloseTo(0.7611, 4)
  })

  it('gives the other forms the confidence bounds R psych::ICC prints for the same data', () => {
    const ratings = SHROUT_FLEISS_1979

    const r = expectOk(icc(ratings))

    // Re-run in R: psych::ICC(sf, lmer = FALSE)$results, columns `lower bound` / `upper bound`:
    // ICC1 −0.1329323 / 0.722560, ICC3 0.3424648 / 0.945858, ICC1k −0.8844422 / 0.912415,
    // ICC2k 0.0711368 / 0.927232, ICC3k 0.6756747 / 0.985892
    expect(r.icc1.ci[0]).toBeCloseTo(-0.133, 3)
    expect(r.icc1.ci[1]).toBeCloseTo(0.72, 2)
    expect(r.icc3.ci[0]).toBeCloseTo(0.342, 3)
    expect(r.icc3.ci[1]).toBeCloseTo(0.95, 2)
    expect(r.icc1k.ci[0]).toBeCloseTo(-0.884, 3)
    expect(r.icc1k.ci[1]).toBeCloseTo(0.91, 2)
    expect(r.icc2k.ci[0]).toBeCloseTo(0.071, 3)
    expect(r.icc2k.ci[1]).toBeCloseTo(0.93, 2)
    expect(r.icc3k.ci[0]).toBeCloseTo(0.676, 3)
    expect(r.icc3k.ci[1]).toBeCloseTo(0.99, 2)
  })

  it('with identical raters, reports perfect agreement 1 with a zero-width interval', () => {
    const ratings = [[1, 1], [2, 2], [4, 4]]

    const r = expectOk(icc(ratings))

    expect(r.icc2).toEqual({ value: 1, ci: [1, 1] })
    expect(r.icc1k).toEqual({ value: 1, ci: [1, 1] })
  })

  it('with raters offset by a constant, keeps consistency at 1 but lowers absolute agreement', () => {
    const ratings = [[1, 2], [2, 3], [3, 4]]

    const r = expectOk(icc(ratings))

    expect(r.icc3).toEqual({ value: 1, ci: [1, 1] })
    expect(r.icc2.value).toBeCloseTo(2 / 3, 12)
    expect(r.icc2.ci.every(Number.isFinite)).toBe(true)
  })

  it('when subjects barely differ, still bounds a strongly negative ICC(2,1) with finite limits', () => {
    const ratings = [[0, 0.6, 0.5, 3.6], [1.5, 0.2, 3.7, 0.5], [1.9, 0.7, 3.8, 0.1]]

    const { icc2 } = expectOk(icc(ratings))

    expect(icc2.value).toBeLessThan(0)
    expect(icc2.ci.every(Number.isFinite)).toBe(true)
    expect(icc2.ci[0]).toBeLessThanOrEqual(icc2.value)
  })

  it.each([
    [[[1, 2]], 'Needs at least 2 subjects'],
    [[[1], [2]], 'Needs at least 2 raters'],
    [[[3, 3], [3, 3]], 'All ratings are identical'],
    [[[1, 2], [1, 2]], 'Subjects do not differ, so the ICC is undefined'],
  ])('with %j, states why no ICC can be given', (ratings, reason) => {
    const result = icc(ratings)

    expect(result).toEqual({ ok: false, reason })
  })

  it('rejects a ragged matrix', () => {
    expect(() => icc([[1, 2], [3]])).toThrow(StatsInputError)
  })
})

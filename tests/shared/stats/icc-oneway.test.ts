import { describe, expect, it } from 'vitest'
import { icc } from '#shared/stats/icc'
import { iccOneWay } from '#shared/stats/icc-oneway'
import { StatsInputError } from '#shared/stats/result'
import { expectOk } from './helpers.ts'
import { SHROUT_FLEISS_1979 } from './reference-data.ts'

describe('iccOneWay, ICC(1,1)', () => {
  it('reproduces Shrout & Fleiss 1979 case 1 on their 6 × 4 example, as R psych::ICC computes it', () => {
    const ratings = SHROUT_FLEISS_1979

    const r = expectOk(iccOneWay(ratings))

    // Shrout & Fleiss 1979 (Psychol Bull 86:420–428): ICC(1,1) = .17. R psych::ICC: 0.1657417684, F = 1.79 on
    // 5 and 18 df (MS between 11.2417, MS within 6.2639), 95% CI −0.1329 to 0.7226.
    expect(r.value).toBeCloseTo(0.1657417684, 10)
    expect(r.msBetween).toBeCloseTo(11.2417, 4)
    expect(r.msWithin).toBeCloseTo(6.2639, 4)
    expect(r.f).toBeCloseTo(1.794678492, 8)
    expect(r.df).toEqual([5, 18])
    expect(r.ci[0]).toBeCloseTo(-0.1329, 4)
    expect(r.ci[1]).toBeCloseTo(0.7226, 4)
    expect([r.n, r.k]).toEqual([6, 4])
  })

  it('does not depend on the order of the readings within a subject', () => {
    const swapped = SHROUT_FLEISS_1979.map((row, i) => (i % 2 ? [...row].reverse() : row))

    const r = expectOk(iccOneWay(swapped))

    expect(r.value).toBeCloseTo(0.1657417684, 10)
  })

  it('agrees with the icc1 form of the six Shrout & Fleiss forms', () => {
    const pairs = [[4, 5], [2, 2.5], [7, 6], [0, 1], [3, 3.5]]

    const oneWay = expectOk(iccOneWay(pairs))

    const all = expectOk(icc(pairs))
    expect(oneWay.value).toBeCloseTo(all.icc1.value, 12)
    expect(oneWay.ci[0]).toBeCloseTo(all.icc1.ci[0], 12)
    expect(oneWay.ci[1]).toBeCloseTo(all.icc1.ci[1], 12)
  })

  it('with identical readings within every subject, reports 1 with a zero-width interval', () => {
    const r = expectOk(iccOneWay([[1, 1], [2, 2], [4, 4]]))

    expect(r.value).toBe(1)
    expect(r.ci).toEqual([1, 1])
  })

  it.each([
    [[[1, 2]], 'Needs at least 2 subjects'],
    [[[1], [2]], 'Needs at least 2 ratings per subject'],
    [[[3, 3], [3, 3]], 'All ratings are identical'],
    [[[1, 2], [2, 1]], 'Subjects do not differ, so the ICC is undefined'],
  ])('with %j, states why no ICC can be given', (ratings, reason) => {
    expect(iccOneWay(ratings)).toEqual({ ok: false, reason })
  })

  it('rejects a ragged matrix', () => {
    expect(() => iccOneWay([[1, 2], [3]])).toThrow(StatsInputError)
  })
})

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { iccOneWay } from '#shared/stats/icc-oneway'
import { iccOneWayFromSums, ratingSums } from '#shared/stats/icc-oneway-sums'
import { StatsInputError } from '#shared/stats/result'
import { expectOk } from './helpers.ts'
import { SHROUT_FLEISS_1979 } from './reference-data.ts'

/** Heights as recorded at the bedside: −5 to 20 cm in half centimetres. */
const height = fc.integer({ min: -10, max: 40 }).map((half) => half / 2)

describe('iccOneWayFromSums, ICC(1,1) from the sums of the ratings', () => {
  it('reproduces Shrout & Fleiss 1979 case 1 on their 6 × 4 example, as R psych::ICC computes it', () => {
    const r = expectOk(iccOneWayFromSums(ratingSums(SHROUT_FLEISS_1979)))

    // Shrout & Fleiss 1979 (Psychol Bull 86:420–428): ICC(1,1) = .17. R psych::ICC: 0.1657417684, F = 1.79 on
    // 5 and 18 df (MS between 11.2417, MS within 6.2639), 95% CI −0.1329 to 0.7226.
    expect(r.value).toBeCloseTo(0.1657417684, 10)
    expect(r.msBetween).toBeCloseTo(11.2417, 4)
    expect(r.msWithin).toBeCloseTo(6.2639, 4)
    expect(r.f).toBeCloseTo(1.794678492, 8)
    expect(r.df).toEqual([5, 18])
    expect(r.ci[0]).toBeCloseTo(-0.1329, 4)
    expect(r.ci[1]).toBeCloseTo(0.7226, 4)
  })

  it('gives what the per-rating function gives on the same pairs: value, CI and mean squares', () => {
    const pairs = fc.array(fc.tuple(height, height), { minLength: 2, maxLength: 200 })
    fc.assert(
      fc.property(pairs, (ratings) => {
        const perRating = iccOneWay(ratings)

        const fromSums = iccOneWayFromSums(ratingSums(ratings))

        expect(fromSums.ok).toBe(perRating.ok)
        // fast-check fails a property that returns anything but undefined or true: assert, then return nothing.
        if (!fromSums.ok || !perRating.ok) {
          expect(fromSums).toEqual(perRating)
          return
        }
        const close = (x: number, y: number) => expect(Math.abs(x - y)).toBeLessThan(1e-9 * Math.max(1, Math.abs(y)))
        close(fromSums.value, perRating.value)
        close(fromSums.msBetween, perRating.msBetween)
        close(fromSums.msWithin, perRating.msWithin)
        if (Number.isFinite(perRating.f)) close(fromSums.f, perRating.f)
        else expect(fromSums.f).toBe(Infinity)
        close(fromSums.ci[0], perRating.ci[0])
        close(fromSums.ci[1], perRating.ci[1])
      }),
    )
  })

  it('with identical readings within every subject, reports 1 with a zero-width interval', () => {
    const r = expectOk(iccOneWayFromSums(ratingSums([[1, 1], [2, 2], [4, 4]])))

    expect(r.value).toBe(1)
    expect(r.ci).toEqual([1, 1])
  })

  it.each([
    [[[1, 2]], 'Needs at least 2 subjects'],
    [[[1], [2]], 'Needs at least 2 ratings per subject'],
    [[[3, 3], [3, 3]], 'All ratings are identical'],
    [[[0.1, 0.1], [0.1, 0.1], [0.1, 0.1]], 'All ratings are identical'],
    [[[1, 2], [2, 1]], 'Subjects do not differ, so the ICC is undefined'],
  ])('with %j, states why no ICC can be given', (ratings, reason) => {
    expect(iccOneWayFromSums(ratingSums(ratings))).toEqual({ ok: false, reason })
  })

  it('rejects a count that is not whole or a sum that is not finite', () => {
    const sums = { n: 3, k: 2, sum: 6, sumOfSquares: 14, sumOfSubjectSquares: 26 }

    expect(() => iccOneWayFromSums({ ...sums, n: 1.5 })).toThrow(StatsInputError)
    expect(() => iccOneWayFromSums({ ...sums, sumOfSquares: Infinity })).toThrow(/sumOfSquares must be a finite number/)
  })
})

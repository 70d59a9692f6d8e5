import { describe, expect, it } from 'vitest'
import { withinSubjectMeanSquare } from '#shared/stats/within-subject'
import { StatsInputError } from '#shared/stats/result'
import { SHROUT_FLEISS_1979 } from './reference-data.ts'

describe('withinSubjectMeanSquare', () => {
  it('gives the one-way MS within of Shrout & Fleiss 1979: 6.2639 on n(k − 1) = 18 df', () => {
    const within = withinSubjectMeanSquare(SHROUT_FLEISS_1979)

    // R psych::ICC on the same data: MS within 6.2639 (F = 11.2417 / 6.2639 = 1.79 on 5 and 18 df)
    expect(within.meanSquare).toBeCloseTo(6.2639, 4)
    expect(within.df).toBe(18)
    expect(within.subjects).toBe(6)
  })

  it('pools rows of different lengths on Σ(k − 1) df and skips a row with a single reading', () => {
    const rows = [[1, 3], [2, 4, 6], [9]]

    const within = withinSubjectMeanSquare(rows)

    // (2 + 8) / (1 + 2)
    expect(within).toEqual({ meanSquare: 10 / 3, df: 3, subjects: 2 })
  })

  it('without a row of two readings, has no mean square', () => {
    expect(withinSubjectMeanSquare([[1], []])).toMatchObject({ meanSquare: Number.NaN, df: 0, subjects: 0 })
  })

  it('rejects a reading that is not a finite number', () => {
    expect(() => withinSubjectMeanSquare([[1, Number.POSITIVE_INFINITY]])).toThrow(StatsInputError)
  })
})

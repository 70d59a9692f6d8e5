import { describe, expect, it } from 'vitest'
import { EXAM_SIGMA_FLOOR_CM, LOCAL_TERM_MIN_N, localTermFromPairs, localTermFromRounds } from '#shared/domain/observer-term'
import { ObserverTermSchema } from '#shared/schemas/exam'
import { StatsInputError } from '#shared/stats/result'

/** n differences alternating −a and +a: mean 0, SD(d) = a·√(n/(n − 1)). */
const alternating = (n: number, a: number, shift = 0) => Array.from({ length: n }, (_, i) => shift + (i % 2 ? a : -a))

// χ² limits of a σ on df degrees of freedom, pinned once in R 4.x:
// sqrt(df / qchisq(c(.975, .025), df)) → df 29: 0.796406932763, 1.344315179240; df 45: 0.82943747694, 1.25952282391;
// df 60: 0.848709738927, 1.217435597992.
const CHI2_29 = [0.796406932763, 1.34431517924]
const CHI2_45 = [0.82943747694, 1.25952282391]
const CHI2_60 = [0.848709738927, 1.217435597992]

describe('localTermFromPairs', () => {
  it('from 30 differences of ±3 cm, gives σ_exam = SD(d)/√2 on 29 df with its χ² 95% CI', () => {
    const sigma = (3 * Math.sqrt(30 / 29)) / Math.SQRT2

    const term = localTermFromPairs(alternating(30, 3))!

    expect(term.source).toBe('local-pairs')
    expect(term.n).toBe(30)
    expect(term.sigmaCm).toBeCloseTo(sigma, 12)
    expect(term.ci![0]).toBeCloseTo(sigma * CHI2_29[0]!, 9)
    expect(term.ci![1]).toBeCloseTo(sigma * CHI2_29[1]!, 9)
    expect(ObserverTermSchema.parse(term)).toEqual(term)
  })

  it('takes the SD about the mean difference: a constant bias between the two readings does not enter σ_exam', () => {
    const centred = localTermFromPairs(alternating(30, 3))!

    const shifted = localTermFromPairs(alternating(30, 3, 1.5))!

    expect(shifted.sigmaCm).toBeCloseTo(centred.sigmaCm, 12)
  })

  it(`below ${LOCAL_TERM_MIN_N} pairs, gives no local term`, () => {
    expect(localTermFromPairs(alternating(29, 3))).toBeNull()
    expect(LOCAL_TERM_MIN_N).toBe(30)
  })

  it('floors σ_exam and its limits at 1.0 cm (product default)', () => {
    const tight = localTermFromPairs(alternating(30, 0.5))!

    // σ = 1.5·√(30/29)/√2 = 1.079: its lower limit 0.859 is floored, the upper 1.450 is not
    const partly = localTermFromPairs(alternating(30, 1.5))!

    expect(EXAM_SIGMA_FLOOR_CM).toBe(1)
    expect(tight).toMatchObject({ sigmaCm: 1, ci: [1, 1] })
    expect(partly.ci![0]).toBe(1)
    expect(partly.ci![1]).toBeCloseTo(((1.5 * Math.sqrt(30 / 29)) / Math.SQRT2) * CHI2_29[1]!, 9)
  })

  it('refuses a difference that is not a finite number', () => {
    expect(() => localTermFromPairs([...alternating(30, 3), Number.NaN])).toThrow(StatsInputError)
  })
})

describe('localTermFromRounds', () => {
  /** Subject i read i, i + 2 and i + 4 cm by three examiners: within-subject SS 8 on 2 df each. */
  const threeExaminers = (n: number) => Array.from({ length: n }, (_, i) => [i, i + 2, i + 4])

  it('from 30 complete subjects × 3 examiners, gives σ_exam = √MS_within on n(k − 1) = 60 df', () => {
    const term = localTermFromRounds(threeExaminers(30))!

    // MS_within = 30 × 8 / 60 = 4
    expect(term).toMatchObject({ source: 'local-rounds', n: 30 })
    expect(term.sigmaCm).toBeCloseTo(2, 12)
    expect(term.ci![0]).toBeCloseTo(2 * CHI2_60[0]!, 9)
    expect(term.ci![1]).toBeCloseTo(2 * CHI2_60[1]!, 9)
  })

  it('pools subjects of rounds with different numbers of examiners on Σ(k − 1) df', () => {
    const pairs = Array.from({ length: 15 }, (_, i) => [i, i + 4])

    const term = localTermFromRounds([...threeExaminers(15), ...pairs])!

    // (15 × 8 + 15 × 8) / (15 × 2 + 15 × 1) = 240 / 45 on 45 df
    const sigma = Math.sqrt(240 / 45)
    expect(term.n).toBe(30)
    expect(term.sigmaCm).toBeCloseTo(sigma, 12)
    expect(term.ci![0]).toBeCloseTo(sigma * CHI2_45[0]!, 9)
    expect(term.ci![1]).toBeCloseTo(sigma * CHI2_45[1]!, 9)
  })

  it('below 30 subjects with two readings or more, gives no local term', () => {
    const term = localTermFromRounds([...threeExaminers(29), [7]])

    expect(term).toBeNull()
  })

  it('floors σ_exam at 1.0 cm', () => {
    const close = Array.from({ length: 30 }, (_, i) => [i, i + 0.2])

    expect(localTermFromRounds(close)).toMatchObject({ sigmaCm: 1, ci: [1, 1] })
  })
})

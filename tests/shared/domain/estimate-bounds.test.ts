import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { makeFindings, makeLocalTerm } from '../factories.ts'

// A bound has one limit: the one-sided 95% point of the normal distribution, z = 1.645 (R: qnorm(0.95) = 1.644854).
const Z_ONE_SIDED = 1.645

describe('computeEstimate, column top above the neck: a lower bound', () => {
  it('at 90° with the neck top 12 cm up, CVP ≥ 12 + 9.8 with the band limit 1.645σ below', () => {
    const findings = makeFindings({ columnTop: 'above-neck', inclinationDeg: 90, heightCm: 12 })
    const sigma = Math.sqrt(0.25 + 4 + 4)

    const estimate = computeEstimate(findings)

    // Seth 2002: 9.8 cm held above 60°, σ_offset widened to 2.0 cm (product default)
    expect(estimate.bound).toBe('lower')
    expect(estimate.cvpCmH2O).toBeCloseTo(21.8, 12)
    expect(estimate.bandCmH2O![0]).toBeCloseTo(21.8 - Z_ONE_SIDED * sigma, 9)
    expect(estimate.bandCmH2O![1]).toBeNull()
    expect(estimate.bandMmHg![1]).toBeNull()
  })

  it('above 10 cmH₂O at its limit reaches only high: clear and elevated', () => {
    const estimate = computeEstimate(makeFindings({ columnTop: 'above-neck', inclinationDeg: 90, heightCm: 12 }))

    // Cook 1990 categories; McGee 1998: 12 cm > 3 cm
    expect(estimate.categories).toEqual(['high'])
    expect(estimate.confidence).toBe('clear')
    expect(estimate.elevated).toBe(true)
  })

  it('reaches the category of its limit and those above', () => {
    const findings = makeFindings({ columnTop: 'above-neck', inclinationDeg: 60, heightCm: 4 })

    const estimate = computeEstimate(findings)

    // 4 + 9.8 − 1.645 × 2.29 = 10.03 lies in high; at 3.5 cm the limit falls to 9.53, in normal
    expect(estimate.bandCmH2O![0]).toBeGreaterThan(10)
    expect(estimate.categories).toEqual(['high'])
    expect(computeEstimate(makeFindings({ ...findings, heightCm: 3.5 })).categories).toEqual(['normal', 'high'])
  })

  it('with the neck top no more than 3 cm up, cannot tell whether the JVP is elevated', () => {
    const estimate = computeEstimate(makeFindings({ columnTop: 'above-neck', inclinationDeg: 60, heightCm: 3 }))

    // McGee 1998: elevated only when more than 3 cm; "at least 3 cm" may or may not be more
    expect(estimate.elevated).toBeNull()
  })
})

describe('computeEstimate, no column even lying flat: an upper bound', () => {
  it('at 0°, CVP ≤ 5.4 cm with one limit 1.645σ above and σ without a reading term', () => {
    const findings = makeFindings({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null, readingPrecision: 'visual' })
    // No height was read: σ_offset 1.0 and σ_observer 2.0 only
    const sigma = Math.sqrt(1 + 4)

    const estimate = computeEstimate(findings)

    // Seth 2002: 5.4 cm supine
    expect(estimate).toMatchObject({ bound: 'upper', cvpCmH2O: 5.4, heightCm: null })
    expect(estimate.sigmaCm).toBeCloseTo(sigma, 12)
    expect(estimate.bandCmH2O![0]).toBeNull()
    expect(estimate.bandCmH2O![1]).toBeCloseTo(5.4 + Z_ONE_SIDED * sigma, 9)
    expect(estimate.bandMmHg![0]).toBeNull()
  })

  it('reaches the category of its limit and those below, and is not elevated', () => {
    const estimate = computeEstimate(makeFindings({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null }))

    // 5.4 + 1.645 × 2.24 = 9.1: normal, and low below it (Cook 1990)
    expect(estimate.categories).toEqual(['low', 'normal'])
    expect(estimate.confidence).toBe('indeterminate')
    expect(estimate.elevated).toBe(false)
  })

  it('with a local term, σ = √(σ_exam² + σ_offset²)', () => {
    const findings = makeFindings({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null })

    const estimate = computeEstimate(findings, { observer: makeLocalTerm({ sigmaCm: 1.5 }) })

    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(2.25 + 1), 12)
  })

  it('ignores a height left over from an earlier entry', () => {
    const findings = makeFindings({ columnTop: 'not-filled', inclinationDeg: 10, heightCm: 6 })

    const estimate = computeEstimate(findings)

    // Seth 2002, linear between 5.4 cm (0°) and 8.0 cm (30°)
    expect(estimate.heightCm).toBeNull()
    expect(estimate.cvpCmH2O).toBeCloseTo(5.4 + (10 / 30) * 2.6, 9)
  })
})

describe('computeEstimate, column not assessable', () => {
  const notAssessable = { columnTop: 'not-assessable', heightCm: null, notAssessableReason: 'habitus' } as const

  it('gives no estimate: every number null, no category, no elevated statement', () => {
    const estimate = computeEstimate(makeFindings(notAssessable))

    expect(estimate).toMatchObject({
      ...{ bound: 'none', cvpCmH2O: null, cvpMmHg: null, bandCmH2O: null, bandMmHg: null, heightCm: null, sigmaCm: null },
      ...{ elevated: null, categories: [], confidence: null },
    })
  })

  it('still carries the caution, the offset, the convention difference and the measurement cautions', () => {
    const estimate = computeEstimate(makeFindings({ ...notAssessable, vein: 'left-internal', context: ['tense-ascites'] }))

    expect(estimate.caution).toBe(CAUTION_TEXT)
    expect(estimate.offsetCm).toBe(9.7)
    expect(estimate.conventionDiffCm).toBe(-4.7)
    expect(estimate.cautions.map((c) => c.code)).toEqual(['left-sided-vein', 'tense-ascites'])
  })
})

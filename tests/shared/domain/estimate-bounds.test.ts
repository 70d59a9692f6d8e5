import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { makeFindings } from '../factories.ts'

describe('computeEstimate, bounds', () => {
  it('when the column top is above the neck, reports a lower bound with an open upper band end', () => {
    const findings = makeFindings({ columnTop: 'above-neck', inclinationDeg: 90, heightCm: 12 })

    const estimate = computeEstimate(findings)

    expect(estimate.bound).toBe('lower')
    expect(estimate.cvpCmH2O).toBeCloseTo(12 + 9.8, 9)
    expect(estimate.bandCmH2O![0]).toBeLessThan(estimate.cvpCmH2O!)
    expect(estimate.bandCmH2O![1]).toBeNull()
    expect(estimate.bandMmHg![1]).toBeNull()
    expect(estimate.elevated).toBe(true)
  })

  it('when the column is not filled even flat, reports an upper bound: CVP at most the offset', () => {
    const findings = makeFindings({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null })

    const estimate = computeEstimate(findings)

    // Seth 2002: 5.4 cm supine
    expect(estimate.bound).toBe('upper')
    expect(estimate.cvpCmH2O).toBe(5.4)
    expect(estimate.heightCm).toBeNull()
    expect(estimate.bandCmH2O![0]).toBeNull()
    expect(estimate.bandCmH2O![1]).toBeGreaterThan(5.4)
    expect(estimate.bandMmHg![0]).toBeNull()
    expect(estimate.elevated).toBe(false)
  })

  it('when the column is not filled, has no reading term in σ', () => {
    const findings = makeFindings({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null, readingPrecision: 'visual' })

    const estimate = computeEstimate(findings)

    // Product defaults: σ_offset 1.0, σ_observer 2.0, no height was read
    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(1 + 4), 9)
  })

  it('when the column is not filled, ignores a height left over from an earlier entry', () => {
    const findings = makeFindings({ columnTop: 'not-filled', inclinationDeg: 30, heightCm: 6 })

    const estimate = computeEstimate(findings)

    expect(estimate.heightCm).toBeNull()
    expect(estimate.cvpCmH2O).toBe(8)
  })

  it('when the column is not assessable, gives no estimate and nulls every number', () => {
    const findings = makeFindings({ columnTop: 'not-assessable', heightCm: null })

    const estimate = computeEstimate(findings)

    expect(estimate).toMatchObject({
      bound: 'none',
      cvpCmH2O: null,
      cvpMmHg: null,
      bandCmH2O: null,
      bandMmHg: null,
      heightCm: null,
      sigmaCm: null,
      elevated: null,
      category: null,
      confidence: null,
    })
  })

  it('when the column is not assessable, still carries the caution, the offset and the hints', () => {
    const findings = makeFindings({ columnTop: 'not-assessable', heightCm: null, vein: 'left-internal' })

    const estimate = computeEstimate(findings)

    expect(estimate.caution).toBe(CAUTION_TEXT)
    expect(estimate.offsetCm).toBe(9.7)
    expect(estimate.hints.map((h) => h.code)).toEqual(['left-sided-vein'])
  })
})

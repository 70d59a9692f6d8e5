import { describe, expect, it } from 'vitest'
import { computeEstimate, offsetSigmaCm } from '#shared/domain/estimate'
import { inclineAdjustedOffset } from '#shared/domain/offset'
import { DEFAULT_ESTIMATE_SETTINGS as defaults } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'

describe('computeEstimate, σ terms', () => {
  it('with a ruler reading uses σ_read 0.5 cm, with a visual one 1.5 cm', () => {
    const ruler = computeEstimate(makeFindings({ readingPrecision: 'ruler' }))

    const visual = computeEstimate(makeFindings({ readingPrecision: 'visual' }))

    // Product defaults, no published source: σ² = σ_read² + 1.0² + 2.0²
    expect(ruler.sigmaCm).toBeCloseTo(Math.sqrt(0.25 + 1 + 4), 9)
    expect(visual.sigmaCm).toBeCloseTo(Math.sqrt(2.25 + 1 + 4), 9)
  })

  it('takes σ_offset 1.0 cm from the Seth 2002 supine IQR 4.7–6.1 cm ÷ 1.349', () => {
    const fromIqr = (6.1 - 4.7) / 1.349

    // Seth 2002, abstract (Results); IQR of a normal distribution = 1.349 σ (from memory)
    expect(defaults.sigmaOffsetCm).toBeCloseTo(fromIqr, 1)
  })

  it.each([0, 30, 45, 60])('with incline-adjusted at %s° uses σ_offset 1.0 cm', (inclinationDeg) => {
    const sigma = offsetSigmaCm(makeFindings({ inclinationDeg }), defaults)

    expect(sigma).toBe(1)
  })

  it.each([61, 90])('with incline-adjusted at %s°, outside the studied range, widens σ_offset to 2.0 cm', (inclinationDeg) => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg }))

    expect(offsetSigmaCm(makeFindings({ inclinationDeg }), defaults)).toBe(2)
    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(0.25 + 4 + 4), 9)
    expect(estimate.outsideStudiedRange).toBe(true)
  })

  it.each([0, 15, 30, 45, 60, 75])('with fixed-5cm at %s° adds its bias: σ_offset = √(1 + (offset_incline − 5)²)', (inclinationDeg) => {
    const bias = inclineAdjustedOffset(inclinationDeg).offsetCm - 5

    const sigma = offsetSigmaCm(makeFindings({ inclinationDeg, offsetModel: 'fixed-5cm' }), defaults)

    expect(sigma).toBeCloseTo(Math.sqrt(1 + bias ** 2), 9)
  })

  it('with fixed-5cm at 45° widens σ to √(0.25 + 1 + 4.7² + 4) = 5.21 cm', () => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg: 45, offsetModel: 'fixed-5cm' }))

    // Seth 2002: 9.7 cm at 45°, so the fixed rule is 4.7 cm short
    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(0.25 + 1 + 4.7 ** 2 + 4), 9)
    expect(estimate.cvpCmH2O).toBe(9)
  })

  it('with a local observer term, uses it and says so', () => {
    const observer = { sigmaCm: 1.2, source: 'local' as const }

    const estimate = computeEstimate(makeFindings(), { observer })

    expect(estimate.observerSource).toBe('local')
    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(0.25 + 1 + 1.44), 9)
  })

  it('without a local observer term, uses the 2.0 cm default and says so', () => {
    const estimate = computeEstimate(makeFindings())

    expect(defaults.sigmaObserverCm).toBe(2)
    expect(estimate.observerSource).toBe('default')
  })
})

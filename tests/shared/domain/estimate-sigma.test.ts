import { describe, expect, it } from 'vitest'
import { computeEstimate, offsetSigmaCm } from '#shared/domain/estimate'
import { DEFAULT_ESTIMATE_SETTINGS as defaults, EstimateSettingsSchema } from '#shared/schemas/settings'
import { makeFindings, makeLocalTerm } from '../factories.ts'

describe('computeEstimate, σ with the default terms', () => {
  it('with a ruler reading uses σ_read 0.5 cm, with a visual one 1.5 cm', () => {
    const ruler = computeEstimate(makeFindings({ readingPrecision: 'ruler' }))

    const visual = computeEstimate(makeFindings({ readingPrecision: 'visual' }))

    // Product defaults, no published source: σ² = σ_read² + 1.0² + 2.0²
    expect(ruler.sigmaCm).toBeCloseTo(Math.sqrt(0.25 + 1 + 4), 12)
    expect(visual.sigmaCm).toBeCloseTo(Math.sqrt(2.25 + 1 + 4), 12)
  })

  it('takes σ_offset 1.0 cm from the Seth 2002 supine IQR 4.7–6.1 cm ÷ 1.349', () => {
    const fromIqr = (6.1 - 4.7) / 1.349

    // Seth 2002, abstract (Results). The IQR of a normal distribution is 1.349 σ by definition of its quartiles:
    // qnorm(.75) * 2 = 1.34898 in R, and (6.1 - 4.7) / (qnorm(.75) * 2) = 1.0378
    expect(defaults.sigmaOffsetCm).toBeCloseTo(fromIqr, 1)
  })

  it.each([0, 30, 45, 60])('at %s°, within the studied range, uses σ_offset 1.0 cm with either offset model', (inclinationDeg) => {
    const adjusted = offsetSigmaCm(makeFindings({ inclinationDeg }), defaults)

    const fixed = offsetSigmaCm(makeFindings({ inclinationDeg, offsetModel: 'fixed-5cm' }), defaults)

    expect([adjusted, fixed]).toEqual([1, 1])
  })

  it.each([61, 90])('at %s°, outside the studied range, widens σ_offset to 2.0 cm', (inclinationDeg) => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg }))

    // Seth 2002 measured up to 60°; 2.0 cm beyond is a product default
    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(0.25 + 4 + 4), 12)
    expect(estimate.outsideStudiedRange).toBe(true)
  })

  it.each([0, 15, 30, 45, 60, 75])('with fixed-5cm at %s° uses the same random terms as incline-adjusted: no bias term', (inclinationDeg) => {
    const fixed = computeEstimate(makeFindings({ inclinationDeg, offsetModel: 'fixed-5cm' }))

    const adjusted = computeEstimate(makeFindings({ inclinationDeg, offsetModel: 'incline-adjusted' }))

    expect(fixed.sigmaCm).toBe(adjusted.sigmaCm)
  })

  it('with fixed-5cm at 45° keeps σ = 2.29 cm around 4 + 5 = 9 cmH₂O', () => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg: 45, offsetModel: 'fixed-5cm' }))

    expect(estimate.cvpCmH2O).toBe(9)
    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(0.25 + 1 + 4), 12)
  })

  it('takes every term from the settings', () => {
    const settings = EstimateSettingsSchema.parse({ sigmaReadRulerCm: 1, sigmaOffsetCm: 2, sigmaObserverCm: 3 })

    const estimate = computeEstimate(makeFindings(), { settings })

    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(1 + 4 + 9), 12)
    expect(estimate.observerSigmaCm).toBe(3)
  })
})

describe('computeEstimate, σ with a local error term', () => {
  // A paired difference holds both examiners' reading and observer error: σ_exam replaces σ_read and σ_observer.
  it.each(['ruler', 'visual'] as const)('with a %s reading, σ = √(σ_exam² + σ_offset²)', (readingPrecision) => {
    const observer = makeLocalTerm({ sigmaCm: 1.2 })

    const estimate = computeEstimate(makeFindings({ readingPrecision }), { observer })

    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(1.44 + 1), 12)
  })

  it('above 60° adds the widened σ_offset of 2.0 cm', () => {
    const observer = makeLocalTerm({ sigmaCm: 1.2 })

    const estimate = computeEstimate(makeFindings({ inclinationDeg: 75 }), { observer })

    expect(estimate.sigmaCm).toBeCloseTo(Math.sqrt(1.44 + 4), 12)
  })

  it('reports its source, σ, n and CI', () => {
    const observer = makeLocalTerm({ source: 'local-rounds', sigmaCm: 1.4, n: 32, ci: [1.1, 1.9] })

    const estimate = computeEstimate(makeFindings(), { observer })

    expect(estimate).toMatchObject({ observerSource: 'local-rounds', observerSigmaCm: 1.4, observerN: 32, observerSigmaCi: [1.1, 1.9] })
  })
})

import { describe, expect, it } from 'vitest'
import { computeEstimate, verticalHeightCm } from '#shared/domain/estimate'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { makeFindings } from '../factories.ts'

describe('computeEstimate, vertical 4 cm at 45°, ruler, incline-adjusted', () => {
  // Offset: Seth 2002 (J Gen Intern Med 17:861–865) median 9.7 cm at 45°. mmHg: NIST SP 811 App. B.8.
  // σ = √(0.5² + 1.0² + 2.0²): the product's default error terms (no published source).
  const estimate = computeEstimate(makeFindings({ inclinationDeg: 45, heightCm: 4, readingPrecision: 'ruler' }))

  it('adds the 9.7 cm offset to the 4 cm height: 13.7 cmH₂O', () => {
    expect(estimate.heightCm).toBe(4)
    expect(estimate.offsetCm).toBe(9.7)
    expect(estimate.cvpCmH2O).toBeCloseTo(13.7, 2)
  })

  it('converts 13.7 cmH₂O to 10.08 mmHg', () => {
    expect(estimate.cvpMmHg).toBeCloseTo(10.08, 2)
  })

  it('gives σ = √(0.25 + 1 + 4) = 2.29 cm', () => {
    expect(estimate.sigmaCm).toBeCloseTo(2.29, 2)
  })

  it('gives the 95% band 9.2–18.2 cmH₂O (13.7 ± 1.96 × 2.29)', () => {
    const [low, high] = estimate.bandCmH2O!

    expect(low).toBeCloseTo(9.21, 2)
    expect(high).toBeCloseTo(18.19, 2)
    expect([low!.toFixed(1), high!.toFixed(1)]).toEqual(['9.2', '18.2'])
  })

  it('gives the same band in mmHg', () => {
    const [low, high] = estimate.bandMmHg!

    // NIST SP 811 App. B.8: ÷ 1.35951
    expect(low).toBeCloseTo(9.2091 / 1.35951, 3)
    expect(high).toBeCloseTo(18.1909 / 1.35951, 3)
  })

  it('calls the JVP elevated, the CVP high and the band indeterminate', () => {
    expect(estimate.elevated).toBe(true)
    expect(estimate.category).toBe('high')
    expect(estimate.confidence).toBe('indeterminate')
  })

  it('reports a point estimate with the default observer term inside the studied range', () => {
    expect(estimate.bound).toBe('point')
    expect(estimate.observerSource).toBe('default')
    expect(estimate.outsideStudiedRange).toBe(false)
    expect(estimate.offsetModel).toBe('incline-adjusted')
  })

  it('carries the caution', () => {
    expect(estimate.caution).toBe(CAUTION_TEXT)
  })
})

describe('verticalHeightCm', () => {
  it('when measured along the neck, takes 8 cm at 30° as 4 cm vertical (h = d × sin θ)', () => {
    const findings = makeFindings({ heightMethod: 'along-neck', alongNeckCm: 8, inclinationDeg: 30, heightCm: null })

    const height = verticalHeightCm(findings)

    // Trigonometry: sin 30° = ½
    expect(height).toBe(4)
  })

  it.each([
    [90, 7, 7],
    [0, 7, 0],
    [45, 10, 10 * Math.SQRT1_2],
  ])('when measured along the neck at %s°, takes %s cm as %s cm vertical', (deg, alongNeckCm, expected) => {
    const findings = makeFindings({ heightMethod: 'along-neck', alongNeckCm, inclinationDeg: deg, heightCm: null })

    const height = verticalHeightCm(findings)

    expect(height).toBeCloseTo(expected, 9)
  })

  it('when measured with a vertical ruler, takes the height as entered', () => {
    const findings = makeFindings({ heightMethod: 'vertical', heightCm: -2.5 })

    const height = verticalHeightCm(findings)

    expect(height).toBe(-2.5)
  })
})

describe('computeEstimate, along the neck', () => {
  it('adds the offset to the vertical height: 8 cm along the neck at 30° gives 4 + 8.0 = 12 cmH₂O', () => {
    const findings = makeFindings({ heightMethod: 'along-neck', alongNeckCm: 8, inclinationDeg: 30, heightCm: null })

    const estimate = computeEstimate(findings)

    // Seth 2002: 8 cm offset at 30°
    expect(estimate.heightCm).toBe(4)
    expect(estimate.cvpCmH2O).toBe(12)
  })
})

import { describe, expect, it } from 'vitest'
import { computeEstimate, defaultObserverTerm, verticalHeightCm } from '#shared/domain/estimate'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { EstimateSchema } from '#shared/schemas/exam'
import { DEFAULT_ESTIMATE_SETTINGS as defaults, EstimateSettingsSchema } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'

describe('computeEstimate, the worked example: vertical 4 cm at 45°, ruler, incline-adjusted, default terms', () => {
  // Offset: Seth 2002 (J Gen Intern Med 17:861–865) median 9.7 cm at 45°. mmHg: NIST SP 811 App. B.8 (÷ 1.35951).
  // σ = √(0.5² + 1.0² + 2.0²): σ_read and σ_observer product defaults, σ_offset from Seth 2002's supine IQR.
  const estimate = computeEstimate(makeFindings({ inclinationDeg: 45, heightCm: 4, readingPrecision: 'ruler' }))

  it('adds the 9.7 cm offset to the 4 cm height: 13.7 cmH₂O = 10.08 mmHg', () => {
    expect(estimate.heightCm).toBe(4)
    expect(estimate.offsetCm).toBe(9.7)
    expect(estimate.cvpCmH2O).toBe(13.7)
    expect(estimate.cvpMmHg).toBeCloseTo(13.7 / 1.35951, 6)
    expect(estimate.cvpMmHg!.toFixed(2)).toBe('10.08')
  })

  it('gives σ = √(0.25 + 1 + 4) = 2.29 cm and the 95% band 9.2–18.2 cmH₂O (13.7 ± 1.96σ)', () => {
    const sigma = Math.sqrt(0.25 + 1 + 4)

    const [low, high] = estimate.bandCmH2O!

    expect(estimate.sigmaCm).toBeCloseTo(sigma, 12)
    expect(low).toBeCloseTo(13.7 - 1.96 * sigma, 9)
    expect(high).toBeCloseTo(13.7 + 1.96 * sigma, 9)
    expect([low!.toFixed(1), high!.toFixed(1)]).toEqual(['9.2', '18.2'])
  })

  it('gives the same band in mmHg', () => {
    const [low, high] = estimate.bandMmHg!

    // NIST SP 811 App. B.8: ÷ 1.35951
    expect(low).toBeCloseTo(9.2091 / 1.35951, 3)
    expect(high).toBeCloseTo(18.1909 / 1.35951, 3)
  })

  it('calls the JVP elevated (4 cm > 3 cm, McGee 1998) and the category normal or high, indeterminate', () => {
    expect(estimate.elevated).toBe(true)
    expect(estimate.categories).toEqual(['normal', 'high'])
    expect(estimate.confidence).toBe('indeterminate')
  })

  it('reports the 5 cm convention 4.7 cm below the CT-derived offset, though the model is incline-adjusted', () => {
    // Seth 2002: 5 − 9.7 at 45°
    expect(estimate.conventionDiffCm).toBe(-4.7)
    expect(estimate.cautions.map((c) => c.code)).not.toContain('convention-offset')
  })

  it('is a rules-version-2 point estimate with the default error term, inside the studied range', () => {
    expect(EstimateSchema.parse(estimate)).toEqual(estimate)
    expect(estimate).toMatchObject({ rulesVersion: 2, bound: 'point', offsetModel: 'incline-adjusted', outsideStudiedRange: false })
    expect(estimate).toMatchObject({ observerSource: 'default', observerSigmaCm: 2, observerN: null, observerSigmaCi: null })
  })

  it('carries the caution', () => {
    expect(estimate.caution).toBe(CAUTION_TEXT)
  })
})

describe('computeEstimate, 2 cm at 45°', () => {
  it('gives 11.7 cmH₂O with the band 7.2–16.2: not elevated, category normal or high', () => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg: 45, heightCm: 2 }))

    // Seth 2002: 2 + 9.7; McGee 1998: 2 cm is not more than 3 cm
    expect(estimate.cvpCmH2O).toBe(11.7)
    expect(estimate.bandCmH2O!.map((v) => v!.toFixed(1))).toEqual(['7.2', '16.2'])
    expect(estimate.elevated).toBe(false)
    expect(estimate.categories).toEqual(['normal', 'high'])
  })
})

describe('defaultObserverTerm', () => {
  it('takes σ_observer from the settings, with no n and no CI', () => {
    const settings = EstimateSettingsSchema.parse({ sigmaObserverCm: 2.5 })

    const term = defaultObserverTerm(settings)

    expect(term).toEqual({ source: 'default', sigmaCm: 2.5, n: null, ci: null })
  })

  it('is what computeEstimate uses when no term is given', () => {
    const given = computeEstimate(makeFindings(), { observer: defaultObserverTerm(defaults) })

    const omitted = computeEstimate(makeFindings())

    expect(omitted).toEqual(given)
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
    [45, 10, 10 * Math.SQRT1_2],
    [60, 10, 5 * Math.sqrt(3)],
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

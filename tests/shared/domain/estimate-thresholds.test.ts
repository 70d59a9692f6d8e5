import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { EstimateSettingsSchema } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'

describe('computeEstimate, elevated JVP', () => {
  // McGee 1998 (Am Heart J 136:10–18): elevated when the top is more than 3 cm above the sternal angle.
  it('when the column top is 3 cm exactly, does not call it elevated', () => {
    const estimate = computeEstimate(makeFindings({ heightCm: 3 }))

    expect(estimate.elevated).toBe(false)
  })

  it('when the column top is 3.01 cm, calls it elevated', () => {
    const estimate = computeEstimate(makeFindings({ heightCm: 3.01 }))

    expect(estimate.elevated).toBe(true)
  })

  it('when 6 cm along the neck at 30° gives exactly 3 cm vertical, does not call it elevated', () => {
    const findings = makeFindings({ heightMethod: 'along-neck', alongNeckCm: 6, inclinationDeg: 30, heightCm: null })

    const estimate = computeEstimate(findings)

    expect(estimate.heightCm).toBe(3)
    expect(estimate.elevated).toBe(false)
  })

  it('when the settings raise the threshold to 4 cm, does not call 3.5 cm elevated', () => {
    const settings = EstimateSettingsSchema.parse({ elevatedAboveCm: 4 })

    const estimate = computeEstimate(makeFindings({ heightCm: 3.5 }), { settings })

    expect(estimate.elevated).toBe(false)
  })
})

describe('computeEstimate, CVP category', () => {
  // Cook 1990 categories (from memory: Am J Med Sci 299:175–178): low < 5, normal 5–10, high > 10 cmH₂O.
  it.each([
    [-0.01, 4.99, 'low'],
    [0, 5, 'normal'],
    [5, 10, 'normal'],
    [5.01, 10.01, 'high'],
  ])('with a fixed 5 cm offset and h = %s cm, calls CVP %s cmH₂O %s', (heightCm, cvp, category) => {
    const findings = makeFindings({ offsetModel: 'fixed-5cm', heightCm })

    const estimate = computeEstimate(findings)

    expect(estimate.cvpCmH2O).toBe(cvp)
    expect(estimate.category).toBe(category)
  })

  it.each([
    [45, -4.7, 5],
    [60, 0.2, 10],
    [60, -4.8, 5],
  ])('at %s° with h = %s cm, lands on %s cmH₂O exactly and calls it normal', (inclinationDeg, heightCm, cvp) => {
    const findings = makeFindings({ inclinationDeg, heightCm })

    const estimate = computeEstimate(findings)

    // Seth 2002 medians 9.7 cm at 45°, 9.8 cm at 60°: the sums are exact in decimal, so no float noise may tip them
    expect(estimate.cvpCmH2O).toBe(cvp)
    expect(estimate.category).toBe('normal')
  })

  it('when the settings move the high threshold to 12, calls 11 cmH₂O normal', () => {
    const settings = EstimateSettingsSchema.parse({ highAboveCmH2O: 12 })

    const estimate = computeEstimate(makeFindings({ offsetModel: 'fixed-5cm', heightCm: 6 }), { settings })

    expect(estimate.category).toBe('normal')
  })
})

describe('computeEstimate, confidence', () => {
  const narrowObserver = { sigmaCm: 0.5, source: 'local' as const }

  it.each([
    // 0° (5.4 cm) − 5 cm = 0.4; 30° (8.0 cm) − 0.5 cm = 7.5; 45° (9.7 cm) + 5.3 cm = 15
    [0, -5, 'low', undefined],
    [30, -0.5, 'normal', narrowObserver],
    [45, 5.3, 'high', undefined],
  ])('at %s° with h = %s cm, the band lies wholly inside %s: clear', (inclinationDeg, heightCm, category, observer) => {
    const findings = makeFindings({ inclinationDeg, heightCm })

    const estimate = computeEstimate(findings, { observer })

    expect(estimate.category).toBe(category)
    expect(estimate.confidence).toBe('clear')
  })

  it('when the band crosses a threshold, is indeterminate', () => {
    const findings = makeFindings({ inclinationDeg: 30, heightCm: -0.5 })

    const estimate = computeEstimate(findings)

    expect(estimate.bandCmH2O![0]).toBeLessThan(5)
    expect(estimate.confidence).toBe('indeterminate')
  })
})

import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { EstimateSettingsSchema } from '#shared/schemas/settings'
import { makeFindings, makeLocalTerm } from '../factories.ts'

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

    // sin 30° = ½ exactly, though Math.sin gives 0.49999999999999994
    expect(estimate.heightCm).toBe(3)
    expect(estimate.elevated).toBe(false)
  })

  it('when the settings raise the threshold to 4 cm, does not call 3.5 cm elevated', () => {
    const settings = EstimateSettingsSchema.parse({ elevatedAboveCm: 4 })

    const estimate = computeEstimate(makeFindings({ heightCm: 3.5 }), { settings })

    expect(estimate.elevated).toBe(false)
  })
})

describe('computeEstimate, CVP categories the 95% band reaches', () => {
  // Categories of Cook 1990 (Am J Med Sci, PMID 2316561): low < 5, normal 5–10, high > 10 cmH₂O.
  it.each([
    // 0° (5.4 cm) − 5 cm = 0.4, band −4.1 to 4.9; 45° (9.7 cm) + 5.3 cm = 15, band 10.5 to 19.5
    [0, -5, ['low']],
    [45, 5.3, ['high']],
    // 45°: 9.7 − 4 = 5.7, band 1.2 to 10.2
    [45, -4, ['low', 'normal', 'high']],
    // 30°: 8.0 + 0 = 8, band 3.5 to 12.5
    [30, 0, ['low', 'normal', 'high']],
    // 60°: 9.8 − 6 = 3.8, band −0.7 to 8.3
    [60, -6, ['low', 'normal']],
  ])('at %s° with h = %s cm, reaches %j', (inclinationDeg, heightCm, categories) => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg, heightCm }))

    expect(estimate.categories).toEqual(categories)
    expect(estimate.confidence).toBe(categories.length === 1 ? 'clear' : 'indeterminate')
  })

  it('with a narrow local term, a band wholly inside normal is clear', () => {
    const observer = makeLocalTerm({ sigmaCm: 0.5 })

    const estimate = computeEstimate(makeFindings({ inclinationDeg: 30, heightCm: -0.5 }), { observer })

    // 7.5 ± 1.96 × √(0.25 + 1) = 5.3 to 9.7
    expect(estimate.categories).toEqual(['normal'])
    expect(estimate.confidence).toBe('clear')
  })

  it('takes the thresholds from the settings', () => {
    const settings = EstimateSettingsSchema.parse({ lowBelowCmH2O: 2, highAboveCmH2O: 20 })

    const estimate = computeEstimate(makeFindings(), { settings })

    // The worked example's band 9.2–18.2 lies inside 2–20
    expect(estimate.categories).toEqual(['normal'])
  })

  it.each([
    [45, -4.7, 5],
    [60, 0.2, 10],
    [60, -4.8, 5],
  ])('at %s° with h = %s cm, lands on %s cmH₂O exactly, with no float noise to tip a threshold', (inclinationDeg, heightCm, cvp) => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg, heightCm }))

    // Seth 2002 medians 9.7 cm at 45°, 9.8 cm at 60°: the sums are exact in decimal
    expect(estimate.cvpCmH2O).toBe(cvp)
  })
})

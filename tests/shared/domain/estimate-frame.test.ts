import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import type { ExamFindingsInput } from '#shared/schemas/exam'
import { EstimateSettingsSchema, type EstimateSettings } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'

function cautionText(overrides: Partial<ExamFindingsInput>, code: string, settings?: EstimateSettings): string | undefined {
  return computeEstimate(makeFindings(overrides), { settings }).cautions.find((c) => c.code === code)?.text
}

describe('computeEstimate, when "elevated" and the category point different ways', () => {
  // McGee 1998 (Am Heart J 136:10–18): > 3 cm is elevated, a rule made in the classical 5 cm frame;
  // Seth 2002 (J Gen Intern Med 17:861–865): the CT-derived offset at 45° is 9.7 cm; Cook 1990: high > 10 cmH₂O.
  it('at 2 cm and 45° (not elevated, 11.7 cmH₂O) explains the frame of the 3 cm rule with the computed numbers', () => {
    const text = cautionText({ inclinationDeg: 45, heightCm: 2 }, 'frame-disagreement')

    expect(text).toContain('JVP not elevated')
    expect(text).toContain('11.7 cmH₂O, is above 10 cmH₂O')
    expect(text).toContain('the 3 cm rule assumes the classical 5 cm offset')
    expect(text).toContain('at 45° the CT-derived offset is 9.7 cm')
    expect(text).toContain('Seth 2002')
  })

  it('at 4 cm and 0° (elevated, 9.4 cmH₂O) explains it the other way', () => {
    const text = cautionText({ inclinationDeg: 0, heightCm: 4 }, 'frame-disagreement')

    // Seth 2002: 5.4 cm supine
    expect(text).toContain('JVP elevated')
    expect(text).toContain('9.4 cmH₂O, is not above 10 cmH₂O')
    expect(text).toContain('at 0° the CT-derived offset is 5.4 cm')
  })

  it('takes the thresholds from the settings', () => {
    const settings = EstimateSettingsSchema.parse({ elevatedAboveCm: 2, highAboveCmH2O: 12 })

    const text = cautionText({ inclinationDeg: 0, heightCm: 2.5 }, 'frame-disagreement', settings)

    expect(text).toContain('the 2 cm rule assumes the classical 5 cm offset, in which a top 2 cm above the sternal angle is 7 cmH₂O')
    expect(text).toContain('7.9 cmH₂O, is not above 12 cmH₂O')
  })

  it.each<[string, Partial<ExamFindingsInput>]>([
    ['elevated and high (the worked example)', { heightCm: 4 }],
    ['not elevated and 9.7 cmH₂O', { heightCm: 0 }],
    ['not elevated and exactly 10 cmH₂O (0.3 + 9.7)', { heightCm: 0.3 }],
    ['a lower bound: at least 9.4 cmH₂O, elevated', { columnTop: 'above-neck', inclinationDeg: 0, heightCm: 4 }],
    ['an upper bound', { columnTop: 'not-filled', inclinationDeg: 0, heightCm: null }],
  ])('gives no frame note for %s', (_, overrides) => {
    const text = cautionText(overrides, 'frame-disagreement')

    expect(text).toBeUndefined()
  })
})

describe('computeEstimate, the 5 cm convention', () => {
  // Seth 2002 medians: 5.4 cm at 0°, 8.0 at 30°, 9.7 at 45°, 9.8 at 60°.
  it.each([
    [0, -0.4],
    [30, -3],
    [45, -4.7],
    [60, -4.8],
    [90, -4.8],
  ])('at %s° reports conventionDiffCm = 5 − the CT-derived offset = %s cm with either model', (inclinationDeg, diff) => {
    const fixed = computeEstimate(makeFindings({ inclinationDeg, offsetModel: 'fixed-5cm' }))

    const adjusted = computeEstimate(makeFindings({ inclinationDeg, offsetModel: 'incline-adjusted' }))

    expect([fixed.conventionDiffCm, adjusted.conventionDiffCm]).toEqual([diff, diff])
  })

  it('with fixed-5cm at 45°, says in numbers and words that it sits 4.7 cm below the CT-derived offset', () => {
    const text = cautionText({ inclinationDeg: 45, offsetModel: 'fixed-5cm' }, 'convention-offset')

    expect(text).toContain('The 5 cm convention sits 4.7 cm below the CT-derived offset at 45°')
    expect(text).toContain('reads 4.7 cmH₂O lower than with the incline-adjusted offset')
  })

  it('with incline-adjusted, gives no convention caution', () => {
    const text = cautionText({ inclinationDeg: 45, offsetModel: 'incline-adjusted' }, 'convention-offset')

    expect(text).toBeUndefined()
  })

  it('with fixed-5cm, centres the estimate on h + 5 and leaves the known difference out of the band', () => {
    const estimate = computeEstimate(makeFindings({ inclinationDeg: 45, offsetModel: 'fixed-5cm', heightCm: 4 }))

    const [low, high] = estimate.bandCmH2O!

    expect(estimate.cvpCmH2O).toBe(9)
    expect(high! - 9).toBeCloseTo(9 - low!, 9)
    expect(high! - low!).toBeCloseTo(2 * 1.96 * Math.sqrt(0.25 + 1 + 4), 9)
  })
})

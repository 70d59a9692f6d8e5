import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { ExamFindingsSchema, type ExamFindingsInput } from '#shared/schemas/exam'
import { EstimateSettingsSchema } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'
import { WORKED_EXAMPLE_FINDINGS } from '../worked-example.ts'

function caution(overrides: Partial<ExamFindingsInput>, code: string) {
  return computeEstimate(makeFindings(overrides)).cautions.find((c) => c.code === code)
}

describe('computeEstimate, measurement cautions', () => {
  it('for the worked example on the right internal jugular with three venous signs, gives none', () => {
    const estimate = computeEstimate(ExamFindingsSchema.parse(WORKED_EXAMPLE_FINDINGS))

    expect(estimate.cautions).toEqual([])
  })

  // Shellenberger 2017 (Cleve Clin J Med): the left brachiocephalic vein can be compressed by the aorta.
  it.each(['left-internal', 'left-external'] as const)('on the %s vein, says the reading may be falsely high', (vein) => {
    const text = caution({ vein }, 'left-sided-vein')?.text

    expect(text).toContain('compressed by the aorta')
    expect(text).toContain('falsely high')
  })

  it.each(['right-internal', 'right-external'] as const)('on the %s vein, gives no left-vein caution', (vein) => {
    expect(caution({ vein }, 'left-sided-vein')).toBeUndefined()
  })

  it('above 60°, says the offset is held at the 60° value of Seth 2002 and its error widened', () => {
    const settings = EstimateSettingsSchema.parse({ sigmaOffsetOutsideRangeCm: 2.5 })

    const text = computeEstimate(makeFindings({ inclinationDeg: 75 }), { settings }).cautions.find((c) => c.code === 'outside-studied-range')?.text

    // Seth 2002 (J Gen Intern Med 17:861–865) measured up to 60°, 9.8 cm there
    expect(text).toContain('At 75°')
    expect(text).toContain('held at its 60° value, 9.8 cm')
    expect(text).toContain('widened to 2.5 cm')
  })

  it('at 60°, inside the studied range, gives no range caution', () => {
    expect(caution({ inclinationDeg: 60 }, 'outside-studied-range')).toBeUndefined()
  })

  it.each<[string, string]>([
    ['positive-pressure-ventilation', 'reads higher'],
    ['svc-obstruction-suspected', 'does not reflect right atrial pressure'],
    ['tense-ascites', 'without raised filling pressure'],
  ])('with the context flag %s, says how it changes the reading', (flag, effect) => {
    const text = caution({ context: [flag as 'tense-ascites'] }, flag)?.text

    expect(text).toContain(effect)
    expect(text).toContain('common practice, no source')
  })

  it('gives one caution per context flag, after the measurement cautions', () => {
    const context = ['tense-ascites', 'positive-pressure-ventilation', 'tense-ascites'] as const

    const venousSigns = WORKED_EXAMPLE_FINDINGS.venousSigns

    const cautions = computeEstimate(makeFindings({ context: [...context], vein: 'left-internal', venousSigns })).cautions.map((c) => c.code)

    expect(cautions).toEqual(['left-sided-vein', 'tense-ascites', 'positive-pressure-ventilation'])
  })
})

import { describe, expect, it } from 'vitest'
import { computeEstimate, hasArterialEvidence } from '#shared/domain/estimate'
import { requiredVenousSigns, venousSignCount } from '#shared/domain/venous-signs'
import type { ExamFindingsInput } from '#shared/schemas/exam'
import { EstimateSettingsSchema } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'

// Cook & Simel 1996 (JAMA 275:630–634): the venous pulsation is impalpable, double-peaked, falls on inspiration,
// changes with position, rises with abdominal pressure and is obliterated by light pressure; the carotid is the opposite.
const FIVE_PRESENT_NO_DOUBLE_PEAK = {
  'not-palpable': 'present',
  'double-peaked': 'absent',
  'falls-on-inspiration': 'present',
  'changes-with-position': 'present',
  'rises-with-abdominal-pressure': 'present',
  'obliterated-by-light-pressure': 'present',
} as const

function codes(overrides: Partial<ExamFindingsInput>, minVenousSigns?: number): string[] {
  const settings = minVenousSigns === undefined ? undefined : EstimateSettingsSchema.parse({ minVenousSigns })
  return computeEstimate(makeFindings(overrides), { settings }).cautions.map((c) => c.code)
}

describe('hasArterialEvidence', () => {
  it.each<[string, ExamFindingsInput['venousSigns'], boolean]>([
    ['a palpable pulsation', { 'not-palpable': 'absent' }, true],
    ['one that persists under light pressure', { 'obliterated-by-light-pressure': 'absent' }, true],
    ['an impalpable pulsation obliterated by light pressure', { 'not-palpable': 'present', 'obliterated-by-light-pressure': 'present' }, false],
    ['neither sign tested', {}, false],
    ['other signs absent', { 'double-peaked': 'absent', 'falls-on-inspiration': 'absent' }, false],
  ])('for %s: %s', (_, venousSigns, expected) => {
    const findings = makeFindings({ venousSigns })

    expect(hasArterialEvidence(findings)).toBe(expected)
    expect(computeEstimate(findings).arterialEvidence).toBe(expected)
  })
})

describe('computeEstimate, arterial evidence', () => {
  it('comes first among the cautions, before every other caution', () => {
    const overrides: Partial<ExamFindingsInput> = { venousSigns: { 'not-palpable': 'absent' }, vein: 'left-internal', offsetModel: 'fixed-5cm', context: ['tense-ascites'] }

    const cautions = codes(overrides)

    expect(cautions[0]).toBe('arterial-evidence')
    expect(cautions).toEqual(['arterial-evidence', 'few-venous-signs', 'frame-disagreement', 'convention-offset', 'left-sided-vein', 'tense-ascites'])
  })

  it('says what was found and asks to confirm the column is venous', () => {
    const findings = makeFindings({ venousSigns: { 'not-palpable': 'absent', 'obliterated-by-light-pressure': 'absent' } })

    const text = computeEstimate(findings).cautions[0]!.text

    expect(text).toContain('palpable')
    expect(text).toContain('persisted under light pressure')
    expect(text).toContain('Confirm the column is venous')
  })

  it('once the examiner confirmed the column is venous, says so and keeps the warning', () => {
    const findings = makeFindings({ venousSigns: { 'not-palpable': 'absent' }, venousConfirmed: true })

    const caution = computeEstimate(findings).cautions[0]!

    expect(caution.code).toBe('arterial-evidence')
    expect(caution.text).toContain('The examiner confirmed the column is venous')
  })
})

describe('venousSignCount', () => {
  it('counts the signs present; absent and untested signs do not count', () => {
    const findings = makeFindings({ venousSigns: { 'not-palpable': 'present', 'double-peaked': 'present', 'falls-on-inspiration': 'absent' } })

    expect(venousSignCount(findings)).toBe(2)
  })

  it('reads the older list form as the listed signs present, each once', () => {
    const findings = makeFindings({ venousSigns: ['not-palpable', 'double-peaked', 'not-palpable'] })

    expect(venousSignCount(findings)).toBe(2)
    expect(findings.venousSigns['falls-on-inspiration']).toBe('not-tested')
  })
})

describe('computeEstimate, too few venous signs', () => {
  it('with 2 of the 3 required present, warns that the pulsation may be arterial', () => {
    const estimate = computeEstimate(makeFindings({ venousSigns: { 'not-palpable': 'present', 'double-peaked': 'present' } }))

    const caution = estimate.cautions.find((c) => c.code === 'few-venous-signs')

    expect(estimate.venousSignCount).toBe(2)
    expect(caution?.text).toContain('fewer than the 3 required')
    expect(caution?.text).toContain('may be arterial')
  })

  it('with 3 present, gives no warning', () => {
    const cautions = codes({ venousSigns: { 'not-palpable': 'present', 'double-peaked': 'present', 'changes-with-position': 'present' } })

    expect(cautions).not.toContain('few-venous-signs')
  })

  it('takes the number from the minVenousSigns setting', () => {
    const settings = EstimateSettingsSchema.parse({ minVenousSigns: 4 })
    const venousSigns = { 'not-palpable': 'present', 'double-peaked': 'present', 'changes-with-position': 'present' } as const

    const estimate = computeEstimate(makeFindings({ venousSigns }), { settings })

    expect(estimate.cautions.find((c) => c.code === 'few-venous-signs')?.text).toContain('fewer than the 4 required')
  })

  it('with no sign tested on a seen column, warns in plain words', () => {
    const estimate = computeEstimate(makeFindings({ venousSigns: {} }))

    expect(estimate.cautions[0]!.text).toMatch(/^No venous sign was recorded present, fewer than the 3 required/)
  })

  it('with the setting at 0, never warns', () => {
    expect(codes({ venousSigns: {} }, 0)).not.toContain('few-venous-signs')
  })

  it.each<[string, Partial<ExamFindingsInput>, boolean]>([
    ['a seen column', {}, true],
    ['a column above the neck', { columnTop: 'above-neck' }, true],
    ['no column even lying flat', { columnTop: 'not-filled', inclinationDeg: 0, heightCm: null }, false],
    ['a column not assessable', { columnTop: 'not-assessable', notAssessableReason: 'habitus', heightCm: null }, false],
  ])('for %s, warns: %s (only a pulsation that was seen can be mistaken for the carotid)', (_, overrides, warns) => {
    expect(codes({ venousSigns: {}, ...overrides }).includes('few-venous-signs')).toBe(warns)
  })
})

describe('requiredVenousSigns and the warning, rhythm-aware', () => {
  // Atrial fibrillation: no a wave, so a single-peaked pulsation (Harrison's Manual of Medicine). Kussmaul sign: the
  // column does not fall on inspiration. Neither expected absence counts against the vein.
  it('in atrial fibrillation, a missing double peak does not count against the vein', () => {
    const af = codes({ venousSigns: FIVE_PRESENT_NO_DOUBLE_PEAK, rhythm: 'atrial-fibrillation' }, 6)

    const sinus = codes({ venousSigns: FIVE_PRESENT_NO_DOUBLE_PEAK, rhythm: 'sinus' }, 6)

    expect(af).not.toContain('few-venous-signs')
    expect(sinus).toContain('few-venous-signs')
  })

  it('with a Kussmaul pattern, a missing inspiratory fall does not count against the vein', () => {
    const venousSigns = { ...FIVE_PRESENT_NO_DOUBLE_PEAK, 'double-peaked': 'present', 'falls-on-inspiration': 'absent' } as const

    const kussmaul = codes({ venousSigns, respiratory: 'rises-on-inspiration' }, 6)

    const normal = codes({ venousSigns, respiratory: 'falls-on-inspiration' }, 6)

    expect(kussmaul).not.toContain('few-venous-signs')
    expect(normal).toContain('few-venous-signs')
  })

  it('caps the required number at the signs that can be present: 4 of 6 in atrial fibrillation with Kussmaul', () => {
    const findings = makeFindings({ rhythm: 'atrial-fibrillation', respiratory: 'rises-on-inspiration' })
    const settings = EstimateSettingsSchema.parse({ minVenousSigns: 6 })
    const three = { 'not-palpable': 'present', 'changes-with-position': 'present', 'rises-with-abdominal-pressure': 'present' } as const

    const text = computeEstimate(makeFindings({ ...findings, venousSigns: three }), { settings }).cautions.find((c) => c.code === 'few-venous-signs')?.text

    expect(requiredVenousSigns(findings, 6)).toBe(4)
    expect(text).toContain('fewer than the 4 that can be present')
    expect(text).toContain('the setting asks for 6')
  })

  it('leaves the default of 3 uncapped, and counts a double peak recorded present in atrial fibrillation', () => {
    const findings = makeFindings({ rhythm: 'atrial-fibrillation', venousSigns: { 'double-peaked': 'present' } })

    expect(requiredVenousSigns(findings, 3)).toBe(3)
    expect(requiredVenousSigns(findings, 6)).toBe(6)
  })
})

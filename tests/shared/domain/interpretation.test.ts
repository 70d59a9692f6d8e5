import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { bandIsClear, categoryOf, hintsFor } from '#shared/domain/interpretation'
import type { ExamFindingsInput } from '#shared/schemas/exam'
import { DEFAULT_ESTIMATE_SETTINGS as defaults } from '#shared/schemas/settings'
import { makeFindings } from '../factories.ts'

describe('hintsFor', () => {
  // Patterns to consider: Harrison's Manual of Medicine; Applefeld, Clinical Methods (3rd ed.) ch. 19.
  it.each<[string, Partial<ExamFindingsInput>, string]>([
    ['cannon-a-waves', { waveform: { aWave: 'cannon' } }, 'atrioventricular dissociation'],
    ['absent-a-waves', { waveform: { aWave: 'absent' } }, 'atrial fibrillation'],
    ['large-v-waves', { waveform: { vWave: 'large' } }, 'tricuspid regurgitation'],
    ['steep-y-descent', { waveform: { yDescent: 'steep' } }, 'constrictive pericarditis'],
    ['kussmaul-sign', { respiratory: 'rises-on-inspiration' }, 'right-ventricular infarction'],
    ['abdominojugular-positive', { abdominojugular: { done: true, riseCm: 4, sustained: true } }, 'raised right-sided filling'],
    ['left-sided-vein', { vein: 'left-internal' }, 'falsely high'],
  ])('suggests %s as a pattern to consider, never a diagnosis', (code, overrides, consider) => {
    const hints = hintsFor(makeFindings(overrides))

    expect(hints).toHaveLength(1)
    expect(Object.keys(hints[0]!).sort()).toEqual(['code', 'consider', 'finding'])
    expect(hints[0]!.code).toBe(code)
    expect(hints[0]!.finding).not.toBe('')
    expect(hints[0]!.consider).toContain(consider)
  })

  it.each<[string, Partial<ExamFindingsInput>]>([
    ['the rise is under 4 cm', { abdominojugular: { done: true, riseCm: 3.9, sustained: true } }],
    ['the rise is not sustained', { abdominojugular: { done: true, riseCm: 5, sustained: false } }],
    ['the test was not done', { abdominojugular: { done: false, riseCm: 5, sustained: true } }],
  ])('does not call the abdominojugular test positive when %s', (_, overrides) => {
    const hints = hintsFor(makeFindings(overrides))

    // Positive = sustained rise ≥ 4 cm (common practice, no source)
    expect(hints).toEqual([])
  })

  it('with normal findings on the right internal jugular, suggests nothing', () => {
    const findings = makeFindings({ waveform: { aWave: 'normal', vWave: 'normal', yDescent: 'normal' }, respiratory: 'falls-on-inspiration' })

    expect(hintsFor(findings)).toEqual([])
  })

  it('lists several patterns in a fixed order', () => {
    const findings = makeFindings({ vein: 'left-external', waveform: { aWave: 'cannon', vWave: 'large' } })

    const codes = hintsFor(findings).map((h) => h.code)

    expect(codes).toEqual(['cannon-a-waves', 'large-v-waves', 'left-sided-vein'])
  })
})

describe('computeEstimate, venous or arterial', () => {
  // Cook & Simel, JAMA 1996;275:630–634: features that tell the venous pulsation from the carotid.
  it('with fewer than 3 venous signs, warns that the pulsation may be arterial', () => {
    const estimate = computeEstimate(makeFindings({ venousSigns: ['not-palpable', 'double-peaked'] }))

    expect(estimate.venousSignCount).toBe(2)
    expect(estimate.mayBeArterial).toBe(true)
  })

  it('with 3 venous signs, gives no warning', () => {
    const estimate = computeEstimate(makeFindings({ venousSigns: ['not-palpable', 'double-peaked', 'falls-on-inspiration'] }))

    expect(estimate.venousSignCount).toBe(3)
    expect(estimate.mayBeArterial).toBe(false)
  })

  it('counts a repeated sign once', () => {
    const findings = makeFindings({ venousSigns: ['not-palpable', 'not-palpable', 'double-peaked'] })

    const estimate = computeEstimate(findings)

    expect(estimate.venousSignCount).toBe(2)
    expect(estimate.mayBeArterial).toBe(true)
  })

  it('when no column was seen, gives no arterial warning: there was no pulsation to mistake', () => {
    const findings = makeFindings({ columnTop: 'not-filled', venousSigns: [] })

    const estimate = computeEstimate(findings)

    expect(estimate.mayBeArterial).toBe(false)
  })
})

describe('categoryOf and bandIsClear', () => {
  // Cook 1990 categories (from memory): low < 5, normal 5–10, high > 10 cmH₂O.
  it.each([
    [4.999, 'low'],
    [5, 'normal'],
    [10, 'normal'],
    [10.001, 'high'],
  ])('calls %s cmH₂O %s', (cvp, category) => {
    expect(categoryOf(cvp, defaults)).toBe(category)
  })

  it.each<[[number | null, number | null], boolean]>([
    [[5, 10], true],
    [[4.9, 6], false],
    [[null, 4.9], true],
    [[null, 5], false],
    [[10.1, null], true],
    [[10, null], false],
    [[null, null], false],
  ])('calls the band %j clear: %s', (band, clear) => {
    expect(bandIsClear(band, defaults)).toBe(clear)
  })
})

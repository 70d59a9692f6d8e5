import { describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { abdominojugularPositive, promptsFor } from '#shared/domain/prompts'
import type { ExamFindingsInput } from '#shared/schemas/exam'
import { makeFindings } from '../factories.ts'

const NORMAL = { waveform: { aWave: 'normal', vWave: 'normal', yDescent: 'normal' }, respiratory: 'falls-on-inspiration' } as const

describe('promptsFor', () => {
  // Differentials: Harrison's Manual of Medicine (JVP waveforms); Int J Clin Cardiol Table 4 (blunted y, steep y);
  // abdominojugular test: Ewy 1988 (Ann Intern Med 109:456–460).
  it.each<[string, Partial<ExamFindingsInput>, string[]]>([
    ['cannon-a-waves', { waveform: { aWave: 'cannon' } }, ['complete heart block', 'ventricular tachycardia', 'junctional rhythm']],
    ['prominent-a-waves', { waveform: { aWave: 'prominent' } }, ['pulmonary hypertension', 'tricuspid stenosis', 'pulmonary stenosis']],
    ['absent-a-waves', { waveform: { aWave: 'absent' }, rhythm: 'atrial-fibrillation' }, ['atrial fibrillation']],
    ['large-v-waves', { waveform: { vWave: 'large' } }, ['tricuspid regurgitation']],
    [
      'steep-y-descent',
      { waveform: { yDescent: 'steep' } },
      ['constrictive pericarditis', 'restrictive cardiomyopathy', 'severe tricuspid regurgitation', 'right-ventricular infarction'],
    ],
    ['blunted-y-descent', { waveform: { yDescent: 'blunted' } }, ['cardiac tamponade (check for pulsus paradoxus)']],
    ['kussmaul-sign', { respiratory: 'rises-on-inspiration' }, ['constrictive pericarditis', 'restrictive cardiomyopathy', 'right-ventricular infarction']],
    [
      'abdominojugular-positive',
      { abdominojugular: { done: true, riseCm: 4, sustained: true } },
      ['raised right-sided filling pressure', 'in heart failure, raised left-sided filling pressure (Ewy 1988)'],
    ],
  ])('prompts %s with its differential, never one diagnosis', (code, overrides, differential) => {
    const prompts = promptsFor(makeFindings({ ...NORMAL, ...overrides }))

    expect(prompts).toHaveLength(1)
    expect(prompts[0]).toMatchObject({ code, differential })
    expect(prompts[0]!.finding).not.toBe('')
    expect(prompts[0]!.query).toBeUndefined()
  })

  it('says the Kussmaul sign is not a feature of tamponade', () => {
    const [prompt] = promptsFor(makeFindings({ ...NORMAL, respiratory: 'rises-on-inspiration' }))

    expect(prompt!.finding).toContain('not a feature of tamponade')
    expect(prompt!.differential).not.toContain('cardiac tamponade')
  })

  it('with absent a waves in sinus rhythm, adds a query: the two contradict each other', () => {
    const [prompt] = promptsFor(makeFindings({ ...NORMAL, waveform: { aWave: 'absent' }, rhythm: 'sinus' }))

    expect(prompt!.query).toContain('sinus')
  })

  it('with normal findings, prompts nothing; a left-sided vein is a caution, not a prompt', () => {
    expect(promptsFor(makeFindings({ ...NORMAL, vein: 'left-internal' }))).toEqual([])
  })

  it('lists several prompts in a fixed order', () => {
    const findings = makeFindings({ ...NORMAL, respiratory: 'rises-on-inspiration', waveform: { aWave: 'cannon', vWave: 'large' } })

    const codes = computeEstimate(findings).prompts.map((p) => p.code)

    expect(codes).toEqual(['cannon-a-waves', 'large-v-waves', 'kussmaul-sign'])
  })
})

describe('abdominojugularPositive', () => {
  // Cook & Simel 1996 (JAMA 275:630–634): sustained rise ≥ 4 cm; Ewy 1988 (Ann Intern Med 109:456–460): abrupt fall
  // of ≥ 4 cm ("3 mmHg") on release.
  it.each<[string, ExamFindingsInput['abdominojugular'], boolean]>([
    ['a sustained rise of 4 cm', { done: true, riseCm: 4, sustained: true }, true],
    ['a sustained rise of 3.9 cm', { done: true, riseCm: 3.9, sustained: true }, false],
    ['a rise of 5 cm that is not sustained', { done: true, riseCm: 5, sustained: false }, false],
    ['a fall of 4 cm on release', { done: true, fallOnReleaseCm: 4 }, true],
    ['a fall of 3.9 cm on release', { done: true, fallOnReleaseCm: 3.9 }, false],
    ['a brief rise with a 4 cm fall on release', { done: true, riseCm: 5, sustained: false, fallOnReleaseCm: 4 }, true],
    ['a test not done', { done: false, riseCm: 5, sustained: true, fallOnReleaseCm: 5 }, false],
  ])('with %s: %s', (_, abdominojugular, positive) => {
    expect(abdominojugularPositive(makeFindings({ abdominojugular }))).toBe(positive)
  })

  it('names the criterion met in the prompt', () => {
    const [prompt] = promptsFor(makeFindings({ ...NORMAL, abdominojugular: { done: true, fallOnReleaseCm: 4.5 } }))

    expect(prompt!.finding).toContain('abrupt fall of 4.5 cm on release')
  })
})

import { describe, expect, it } from 'vitest'
import { formatExamNote } from '#shared/domain/exam-note'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { makeApiExam as makeExam } from '../api-exam'
import { makeSignature } from '../signature'

describe('formatExamNote', () => {
  it('writes the exam time in the reader locale with its zone, as the app and the e-mails do', () => {
    const exam = makeExam()

    const note = formatExamNote(exam, { timeZone: 'Europe/Paris', locale: 'en-US' })

    // 09:30 UTC is 10:30 in Paris in March; en-US puts the month first and names the zone by its offset (Unicode CLDR).
    expect(note).toContain('Examined Mar 14, 2026, 10:30 GMT+1 (Europe/Paris) by')
  })

  it('for the worked example, gives 13.7 cmH₂O, 10.1 mmHg, the band 9.2–18.2 and the model', () => {
    const exam = makeExam()

    const note = formatExamNote(exam, { timeZone: 'UTC' })

    expect(note).toContain('13.7 cmH₂O')
    expect(note).toContain('10.1 mmHg')
    expect(note).toContain('95% band 9.2–18.2 cmH₂O')
    expect(note).toContain('incline-adjusted')
    expect(note).toContain('9.7 cm sternal angle to right atrium')
  })

  it('names the patient, the time, the examiner, the inclination source, the vein and the height with its method', () => {
    const exam = makeExam({ inclinationSource: 'sensor' })

    const note = formatExamNote(exam, { timeZone: 'UTC', locale: 'en-GB' })

    expect(note).toContain('patient SM-0142')
    expect(note).toContain('14 Mar 2026, 09:30 UTC')
    expect(note).toContain('Dr Sam Whitcombe')
    expect(note).toContain('45° from horizontal (measured by phone sensor)')
    expect(note).toContain('right internal jugular vein')
    expect(note).toContain('4.0 cm above the sternal angle (vertical rule, read with a ruler)')
  })

  it('states the JVP elevated and the categories the band reaches, with its confidence', () => {
    const exam = makeExam()

    const note = formatExamNote(exam)

    // McGee 1998: 4 cm > 3 cm; the band 9.2–18.2 reaches normal and high (Cook 1990 categories)
    expect(note).toContain(
      'Interpretation: JVP elevated (more than 3 cm above the sternal angle); CVP category normal or high (indeterminate: the 95% band reaches more than one category).',
    )
  })

  it('for 2 cm at 45°, states not elevated, normal or high, and the frame note explaining the 3 cm rule', () => {
    const exam = makeExam({ heightCm: 2 })

    const note = formatExamNote(exam)

    expect(note).toContain('JVP not elevated (not more than 3 cm above the sternal angle); CVP category normal or high')
    expect(note).toMatch(/^Note: JVP not elevated .*the 3 cm rule assumes the classical 5 cm offset.*at 45° the CT-derived offset is 9\.7 cm/m)
  })

  it('puts the arterial warning before the estimate', () => {
    const exam = makeExam({ venousSigns: { 'not-palpable': 'absent', 'double-peaked': 'present', 'falls-on-inspiration': 'present' } })

    const lines = formatExamNote(exam).split('\n')

    const warning = lines.findIndex((line) => line.startsWith('Warning: Arterial evidence'))
    expect(warning).toBeGreaterThan(0)
    expect(warning).toBeLessThan(lines.findIndex((line) => line.startsWith('Estimated CVP')))
  })

  it('names the error terms used: the defaults', () => {
    const note = formatExamNote(makeExam())

    expect(note).toContain('; default error terms.')
  })

  it('ends with the caution text', () => {
    const exam = makeExam()

    const lines = formatExamNote(exam).split('\n')

    expect(lines.at(-1)).toBe(`Caution: ${CAUTION_TEXT}`)
  })

  it('when the column top is above the neck, words the estimate and band as lower bounds', () => {
    const exam = makeExam({ columnTop: 'above-neck' })

    const note = formatExamNote(exam)

    // One-sided 95% limit: 13.7 − 1.645 × 2.29 = 9.9
    expect(note).toContain('Estimated CVP: at least 13.7 cmH₂O')
    expect(note).toContain('95% band at least 9.9 cmH₂O')
    expect(note).not.toContain('9.2–18.2')
  })

  it('when the column is not filled even flat, words the estimate as an upper bound, not elevated', () => {
    const exam = makeExam({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null })

    const note = formatExamNote(exam)

    // Seth 2002: 5.4 cm supine
    expect(note).toContain('Column: not filled, even lying flat.')
    expect(note).toContain('Estimated CVP: at most 5.4 cmH₂O')
    expect(note).toContain('JVP not elevated (no column even lying flat); CVP category low or normal')
  })

  it('when the column is not assessable, gives the reason, no estimate and no category, and keeps the caution', () => {
    const exam = makeExam({ columnTop: 'not-assessable', notAssessableReason: 'lines-or-dressings', heightCm: null })

    const note = formatExamNote(exam)

    expect(note).toContain('Column: top could not be assessed (lines or dressings in the way).')
    expect(note).toContain('Estimated CVP: none')
    expect(note).not.toContain('cmH₂O (')
    expect(note).not.toContain('Interpretation')
    expect(note).toContain(CAUTION_TEXT)
  })

  it('lists the venous signs by state and warns when fewer than the required number are present', () => {
    const exam = makeExam({ venousSigns: { 'double-peaked': 'present', 'falls-on-inspiration': 'absent' } })

    const note = formatExamNote(exam)

    expect(note).toContain('Venous signs: 1 of 6 present (double-peaked); 1 absent (no fall on inspiration); 4 not tested.')
    expect(note).toContain('Warning: Only 1 venous sign was recorded present, fewer than the 3 required: the pulsation may be arterial')
  })

  it('gives the measurement cautions beside the number: a left-sided vein, a context flag', () => {
    const exam = makeExam({ vein: 'left-internal', context: ['positive-pressure-ventilation'] })

    const note = formatExamNote(exam)

    expect(note).toMatch(/^Note: Read on a left-sided vein/m)
    expect(note).toMatch(/^Note: Positive-pressure ventilation/m)
  })

  it('lists the waveform, Kussmaul and abdominojugular findings but leaves the prompts out', () => {
    const exam = makeExam({
      waveform: { aWave: 'cannon', vWave: 'large', yDescent: 'unclear' },
      respiratory: 'rises-on-inspiration',
      abdominojugular: { done: true, riseCm: 5, sustained: true, fallOnReleaseCm: 2 },
    })

    const note = formatExamNote(exam)

    expect(note).toContain(
      'a wave cannon; v wave large; column rises on inspiration (Kussmaul sign); abdominojugular test positive (rise 5.0 cm, sustained; fall on release 2.0 cm)',
    )
    expect(exam.estimate.prompts).toHaveLength(4)
    expect(note).not.toContain('Prompt')
    expect(note).not.toContain('heart block')
  })

  it('with includePrompts, adds each prompt labelled as a prompt, with its differential', () => {
    const exam = makeExam({ waveform: { aWave: 'cannon', vWave: 'normal', yDescent: 'normal' } })

    const note = formatExamNote(exam, { includePrompts: true })

    expect(note).toContain('Prompts from Plumbline (to consider, not findings):')
    expect(note).toContain('Prompt from Plumbline (not a finding): Cannon a waves (atrioventricular dissociation); consider complete heart block, ventricular tachycardia or junctional rhythm.')
  })

  it('for an along-neck reading, gives the vertical height and the distance along the neck', () => {
    const exam = makeExam({ heightMethod: 'along-neck', heightCm: null, alongNeckCm: 8, readingPrecision: 'visual' })

    const note = formatExamNote(exam)

    expect(note).toContain('5.7 cm above the sternal angle (8.0 cm along the neck, estimated by eye)')
  })

  it('with the fixed model above 60°, names the model and flags the angle as outside the studied range', () => {
    const exam = makeExam({ offsetModel: 'fixed-5cm', inclinationDeg: 75 })

    const note = formatExamNote(exam)

    expect(note).toContain('Offset model: fixed-5cm, 5.0 cm')
    expect(note).toContain('beyond the studied angles')
  })

  it('includes the countersignature: printed name, date and time in the signing zone, and meaning in words', () => {
    const exam = makeExam({ status: 'countersigned', version: 2, signatures: [makeSignature()] })

    const note = formatExamNote(exam)

    expect(note).toContain(
      'Countersigned by Dr Tomas Lindqvist, 14 Jul 2026, 09:30 BST (Europe/London); meaning: reviewed, and agrees with the findings; version 2.',
    )
  })

  it('marks a signature of an amended version as superseded and keeps it in the note', () => {
    const superseded = makeSignature({ superseded: true, supersededAt: '2026-07-15T08:00:00.000+01:00', meaning: 'reviewed-re-examined' })
    const exam = makeExam({ status: 'draft', version: 3, signatures: [superseded] })

    const note = formatExamNote(exam)

    expect(note).toContain('Superseded countersignature (the record was amended after signing on 15 Jul 2026, 08:00 BST (Europe/London)): Dr Tomas Lindqvist')
    expect(note).toContain('meaning: reviewed after examining the patient in person')
    expect(note).not.toContain('Countersigned by')
  })

  it('warns when a signed record no longer matches its signature', () => {
    const exam = makeExam({ status: 'countersigned', signatures: [makeSignature({ valid: false })] })

    const note = formatExamNote(exam)

    expect(note).toContain('INTEGRITY WARNING')
  })

  it('puts the signatures before the caution, which stays last', () => {
    const exam = makeExam({ status: 'countersigned', signatures: [makeSignature()] })

    const lines = formatExamNote(exam).split('\n')

    expect(lines.at(-2)).toMatch(/^Countersigned by/)
    expect(lines.at(-1)).toBe(`Caution: ${CAUTION_TEXT}`)
  })
})

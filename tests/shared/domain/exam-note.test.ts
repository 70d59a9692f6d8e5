import { describe, expect, it } from 'vitest'
import { formatExamNote } from '#shared/domain/exam-note'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { makeApiExam as makeExam } from '../api-exam'
import { makeSignature } from '../signature'

describe('formatExamNote', () => {
  it('for the §4 worked example, gives 13.7 cmH₂O, 10.1 mmHg, the band 9.2–18.2 and the model', () => {
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

    const note = formatExamNote(exam, { timeZone: 'UTC' })

    expect(note).toContain('patient SM-0142')
    expect(note).toContain('14 Mar 2026, 09:30 UTC')
    expect(note).toContain('Dr Sam Whitcombe')
    expect(note).toContain('45° from horizontal (measured by phone sensor)')
    expect(note).toContain('right internal jugular vein')
    expect(note).toContain('4.0 cm above the sternal angle (vertical rule, read with a ruler)')
  })

  it('says the JVP is elevated and gives the category with its confidence', () => {
    const exam = makeExam()

    const note = formatExamNote(exam)

    expect(note).toContain('JVP elevated; CVP category high (indeterminate')
  })

  it('ends with the caution text', () => {
    const exam = makeExam()

    const lines = formatExamNote(exam).split('\n')

    expect(lines.at(-1)).toBe(`Caution: ${CAUTION_TEXT}`)
  })

  it('when the column top is above the neck, words the estimate and band as lower bounds', () => {
    const exam = makeExam({ columnTop: 'above-neck' })

    const note = formatExamNote(exam)

    expect(note).toContain('Estimated CVP: at least 13.7 cmH₂O')
    expect(note).toContain('95% band at least 9.2 cmH₂O')
    expect(note).not.toContain('9.2–18.2')
  })

  it('when the column is not filled even flat, words the estimate as an upper bound', () => {
    const exam = makeExam({ columnTop: 'not-filled', heightCm: null })

    const note = formatExamNote(exam)

    expect(note).toContain('Column: not filled, even lying flat.')
    expect(note).toContain('Estimated CVP: at most 9.7 cmH₂O')
  })

  it('when the column is not assessable, gives no estimate and no category but keeps the caution', () => {
    const exam = makeExam({ columnTop: 'not-assessable', heightCm: null })

    const note = formatExamNote(exam)

    expect(note).toContain('Estimated CVP: none')
    expect(note).not.toContain('cmH₂O (')
    expect(note).not.toContain('CVP category')
    expect(note).toContain(CAUTION_TEXT)
  })

  it('when fewer than three venous features are ticked, warns that the pulsation may be arterial', () => {
    const exam = makeExam({ venousSigns: ['double-peaked'] })

    const note = formatExamNote(exam)

    expect(note).toContain('1 of 6 venous features (double-peaked)')
    expect(note).toContain('may be arterial')
  })

  it('lists the waveform, Kussmaul and abdominojugular findings and their hints as things to consider', () => {
    const exam = makeExam({
      waveform: { aWave: 'cannon', vWave: 'large', yDescent: 'unclear' },
      respiratory: 'rises-on-inspiration',
      abdominojugular: { done: true, riseCm: 5, sustained: true },
    })

    const note = formatExamNote(exam)

    expect(note).toContain('a wave cannon; v wave large; column rises on inspiration (Kussmaul sign); abdominojugular test positive (rise 5.0 cm, sustained)')
    expect(note).toContain('Consider atrioventricular dissociation (cannon a waves).')
    expect(note).toContain('Consider tricuspid regurgitation')
    expect(note).toContain('Consider raised right-sided filling pressure')
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

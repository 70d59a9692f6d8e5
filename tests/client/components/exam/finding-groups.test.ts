import { describe, expect, it } from 'vitest'
import { findingGroups } from '@/components/exam/finding-groups'
import { makeExam } from './make-exam'

function rowsOf(title: string, exam = makeExam()) {
  return Object.fromEntries(findingGroups(exam).find((group) => group.title === title)?.rows ?? [])
}

describe('findingGroups', () => {
  it('groups the record as position, pulsation, height, waveform and manoeuvres, and notes', () => {
    const exam = makeExam()

    const titles = findingGroups(exam).map((group) => group.title)

    expect(titles).toEqual(['Patient and position', 'Pulsation', 'Height', 'Waveform and manoeuvres', 'Notes'])
  })

  it('for an along-neck reading, gives the distance along the neck and the vertical height', () => {
    const exam = makeExam({ heightMethod: 'along-neck', heightCm: null, alongNeckCm: 8 })

    const rows = rowsOf('Height', exam)

    expect(rows['Along the neck']).toBe('8.0 cm')
    expect(rows['Above the sternal angle']).toBe('5.7 cm')
  })

  it('when the column was not filled, gives no height rows', () => {
    const exam = makeExam({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null })

    const rows = rowsOf('Height', exam)

    expect(rows).toEqual({ 'Column top': 'Not filled, even lying flat' })
  })

  it('describes the inclination source, the vein and a done abdominojugular test with its fall on release', () => {
    const exam = makeExam({ inclinationSource: 'sensor', vein: 'left-internal', abdominojugular: { done: true, riseCm: 5, sustained: true, fallOnReleaseCm: 4 } })

    const position = rowsOf('Patient and position', exam)
    const manoeuvres = rowsOf('Waveform and manoeuvres', exam)

    expect(position['Inclination']).toBe('45° from horizontal (measured by phone)')
    expect(position['Vein']).toBe('Left internal jugular')
    expect(manoeuvres['Abdominojugular test']).toBe('Done, rise 5.0 cm, sustained, fall on release 4.0 cm')
  })

  it('lists each venous sign under its state, and the circumstances recorded', () => {
    const exam = makeExam({
      venousSigns: { 'not-palpable': 'present', 'double-peaked': 'absent' },
      context: ['tense-ascites'],
    })

    const pulsation = rowsOf('Pulsation', exam)
    const position = rowsOf('Patient and position', exam)

    expect(pulsation['Venous signs present']).toBe('not palpable')
    expect(pulsation['Absent']).toBe('double-peaked')
    expect(pulsation['Not tested']).toContain('falls on inspiration')
    expect(position['Circumstances']).toBe('Tense ascites')
  })

  it('for a column not assessable, gives the reason, with the text of another reason', () => {
    const exam = makeExam({ columnTop: 'not-assessable', heightCm: null, notAssessableReason: 'other', notAssessableText: 'Neck brace' })

    const rows = rowsOf('Height', exam)

    expect(rows).toEqual({ 'Column top': 'Could not be assessed', Reason: 'Other: Neck brace' })
  })
})

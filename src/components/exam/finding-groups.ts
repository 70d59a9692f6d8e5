import { VENOUS_SIGN_LABEL, oneDp } from '#shared/domain/exam-note'
import { VenousSignSchema, type Exam, type VenousSignState } from '#shared/schemas/exam'
import { abdominojugularWords, capitalise, COLUMN_TOP_WORDS, NOT_ASSESSABLE_WORDS, RESPIRATORY_WORDS, veinWords } from '@/utils/exam-words'
import { formatDateTime } from '@/utils/format'
import { CONTEXT_LABELS } from './exam-format'

export interface FindingGroup {
  title: string
  icon: string
  rows: [label: string, value: string][]
}

function positionRows(exam: Exam): FindingGroup['rows'] {
  return [
    ['Patient code', exam.patientCode],
    ['Examined', `${formatDateTime(exam.examinedAt)} by ${exam.examinerName}`],
    ['Team', exam.teamName],
    ['Inclination', `${exam.inclinationDeg}° from horizontal (${exam.inclinationSource === 'sensor' ? 'measured by phone' : 'entered'})`],
    ['Vein', veinWords(exam.vein)],
    ['Circumstances', exam.context.map((flag) => CONTEXT_LABELS[flag]).join(', ') || 'None recorded'],
  ]
}

function signsIn(exam: Exam, state: VenousSignState): string {
  return VenousSignSchema.options.filter((sign) => exam.venousSigns[sign] === state).map((sign) => VENOUS_SIGN_LABEL[sign]).join(', ')
}

function pulsationRows(exam: Exam): FindingGroup['rows'] {
  const present = signsIn(exam, 'present')
  const rows: FindingGroup['rows'] = [
    ['Venous signs present', present || 'None'],
    ['Absent', signsIn(exam, 'absent') || 'None'],
    ['Not tested', signsIn(exam, 'not-tested') || 'None'],
    ['Rhythm', capitalise(exam.rhythm)],
  ]
  if (exam.venousConfirmed) rows.push(['Column', 'Confirmed venous by the examiner'])
  return rows
}

function heightRows(exam: Exam): FindingGroup['rows'] {
  const h = exam.estimate.heightCm
  const rows: FindingGroup['rows'] = [['Column top', COLUMN_TOP_WORDS[exam.columnTop]]]
  if (exam.columnTop === 'not-assessable' && exam.notAssessableReason) {
    const text = exam.notAssessableReason === 'other' && exam.notAssessableText ? `: ${exam.notAssessableText}` : ''
    rows.push(['Reason', `${NOT_ASSESSABLE_WORDS[exam.notAssessableReason]}${text}`])
  }
  if (exam.columnTop !== 'seen' && exam.columnTop !== 'above-neck') return rows
  rows.push(['Method', exam.heightMethod === 'vertical' ? 'Vertical rule at the sternal angle' : 'Along the neck'])
  if (exam.heightMethod === 'along-neck') rows.push(['Along the neck', `${oneDp(exam.alongNeckCm ?? 0)} cm`])
  rows.push(['Above the sternal angle', h === null ? '—' : `${oneDp(h)} cm`])
  rows.push(['Reading', exam.readingPrecision === 'ruler' ? 'With a ruler' : 'By eye'])
  return rows
}

function waveformRows(exam: Exam): FindingGroup['rows'] {
  return [
    ['a wave', capitalise(exam.waveform.aWave)],
    ['v wave', capitalise(exam.waveform.vWave)],
    ['y descent', capitalise(exam.waveform.yDescent)],
    ['Respiration', RESPIRATORY_WORDS[exam.respiratory]],
    ['Abdominojugular test', abdominojugularWords(exam.abdominojugular)],
  ]
}

/** The record's findings in the groups the detail page and its print-out show. */
export function findingGroups(exam: Exam): FindingGroup[] {
  return [
    { title: 'Patient and position', icon: 'mdi-angle-acute', rows: positionRows(exam) },
    { title: 'Pulsation', icon: 'mdi-heart-pulse', rows: pulsationRows(exam) },
    { title: 'Height', icon: 'mdi-ruler', rows: heightRows(exam) },
    { title: 'Waveform and manoeuvres', icon: 'mdi-waveform', rows: waveformRows(exam) },
    { title: 'Notes', icon: 'mdi-note-text-outline', rows: [['Notes', exam.notes.trim() || 'None']] },
  ]
}

import type { Estimate, Exam, ExamStatus, Vein, VenousSign } from '../schemas/exam.ts'
import { CAUTION_TEXT } from './interpretation.ts'
import { signatureText } from './signature-text.ts'

export const VEIN_LABEL: Record<Vein, string> = {
  'right-internal': 'right internal jugular',
  'left-internal': 'left internal jugular',
  'right-external': 'right external jugular',
  'left-external': 'left external jugular',
}

export const VENOUS_SIGN_LABEL: Record<VenousSign, string> = {
  'not-palpable': 'not palpable',
  'double-peaked': 'double-peaked',
  'falls-on-inspiration': 'falls on inspiration',
  'changes-with-position': 'changes with position',
  'rises-with-abdominal-pressure': 'rises with abdominal pressure',
  'obliterated-by-light-pressure': 'obliterated by light pressure',
}

export const STATUS_LABEL: Record<ExamStatus, string> = {
  draft: 'Draft',
  submitted: 'Submitted',
  countersigned: 'Countersigned',
  returned: 'Returned',
}

const RESPIRATORY_TEXT: Record<Exam['respiratory'], string | null> = {
  'falls-on-inspiration': 'column falls on inspiration',
  'rises-on-inspiration': 'column rises on inspiration (Kussmaul sign)',
  'no-change': 'column unchanged with breathing',
  'not-assessed': null,
}

/** One decimal place, the precision every figure in the note is given to. */
export function oneDp(value: number): string {
  return value.toFixed(1)
}

/** The 95% band in words: "9.2–18.2", "at least 9.2" or "at most 14.2"; null when there is none. */
export function bandText(band: Estimate['bandCmH2O']): string | null {
  if (!band || (band[0] === null && band[1] === null)) return null
  if (band[1] === null) return `at least ${oneDp(band[0]!)}`
  if (band[0] === null) return `at most ${oneDp(band[1])}`
  return `${oneDp(band[0])}–${oneDp(band[1])}`
}

function examinedText(iso: string, timeZone?: string): string {
  const format = new Intl.DateTimeFormat('en-GB', {
    ...{ day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' },
    ...{ hourCycle: 'h23', timeZoneName: 'short', timeZone },
  } as const)
  return format.format(new Date(iso))
}

function heightText(exam: Exam, heightCm: number): string {
  const where = heightCm < 0 ? `${oneDp(-heightCm)} cm below` : `${oneDp(heightCm)} cm above`
  const how = exam.heightMethod === 'along-neck' ? `${oneDp(exam.alongNeckCm ?? 0)} cm along the neck` : 'vertical rule'
  const precision = exam.readingPrecision === 'ruler' ? 'read with a ruler' : 'estimated by eye'
  return `${where} the sternal angle (${how}, ${precision})`
}

function columnLine(exam: Exam): string {
  const h = exam.estimate.heightCm
  if (exam.columnTop === 'not-filled') return 'Column: not filled, even lying flat.'
  if (exam.columnTop === 'not-assessable' || h === null) return 'Column: top could not be assessed.'
  if (exam.columnTop === 'above-neck') return `Column: top above the visible neck, at least ${heightText(exam, h)}.`
  return `Column: top ${heightText(exam, h)}.`
}

function estimateLine({ bound, cvpCmH2O, cvpMmHg, bandCmH2O, bandMmHg }: Estimate): string {
  if (bound === 'none' || cvpCmH2O === null || cvpMmHg === null) return 'Estimated CVP: none (the column top was not measured).'
  const prefix = bound === 'lower' ? 'at least ' : bound === 'upper' ? 'at most ' : ''
  const band = bandText(bandCmH2O)
  const bandPart = band ? `; 95% band ${band} cmH₂O (${bandText(bandMmHg)} mmHg)` : ''
  return `Estimated CVP: ${prefix}${oneDp(cvpCmH2O)} cmH₂O (${oneDp(cvpMmHg)} mmHg)${bandPart}.`
}

function modelLine(e: Estimate): string {
  const range = e.outsideStudiedRange ? ', held beyond the studied angles (above 60°)' : ''
  const observer = e.observerSource === 'local' ? 'from local paired exams' : 'default'
  return `Offset model: ${e.offsetModel}, ${oneDp(e.offsetCm)} cm sternal angle to right atrium${range}; observer spread: ${observer}.`
}

function interpretationLine(e: Estimate): string | null {
  if (e.category === null) return null
  const confidence = e.confidence === 'clear' ? 'clear' : 'indeterminate, the band crosses a category limit'
  return `Interpretation: JVP ${e.elevated ? 'elevated' : 'not elevated'}; CVP category ${e.category} (${confidence}).`
}

function pulsationLine(exam: Exam): string {
  const { venousSignCount, mayBeArterial } = exam.estimate
  const signs = exam.venousSigns.map((s) => VENOUS_SIGN_LABEL[s]).join(', ')
  const listed = signs ? ` (${signs})` : ''
  const warning = mayBeArterial ? ' Warning: too few venous features; the pulsation may be arterial.' : ''
  return `Pulsation: ${venousSignCount} of 6 venous features${listed}.${warning}`
}

const RHYTHM_TEXT: Record<Exam['rhythm'], string | null> = {
  sinus: 'sinus rhythm',
  'atrial-fibrillation': 'atrial fibrillation',
  paced: 'paced rhythm',
  other: 'other rhythm',
  unknown: null,
}

function abdominojugularText(exam: Exam): string | null {
  const { done, riseCm, sustained } = exam.abdominojugular
  if (!done) return null
  const positive = exam.estimate.hints.some((hint) => hint.code === 'abdominojugular-positive')
  const rise = riseCm === undefined ? '' : ` (rise ${oneDp(riseCm)} cm${sustained ? ', sustained' : ''})`
  return `abdominojugular test ${positive ? 'positive' : 'negative'}${rise}`
}

function findingsLine(exam: Exam): string | null {
  const { aWave, vWave, yDescent } = exam.waveform
  const parts = [
    RHYTHM_TEXT[exam.rhythm],
    aWave === 'unclear' ? null : `a wave ${aWave}`,
    vWave === 'unclear' ? null : `v wave ${vWave}`,
    yDescent === 'unclear' ? null : `y descent ${yDescent}`,
    RESPIRATORY_TEXT[exam.respiratory],
    abdominojugularText(exam),
  ].filter((part) => part !== null)
  return parts.length ? `Findings: ${parts.join('; ')}.` : null
}

export interface ExamNoteOptions {
  /** IANA zone for the exam time; the runtime's own zone when omitted. */
  timeZone?: string
}

/** A concise plain-text summary of an exam for pasting into a health record, with every countersignature; the caution comes last. */
export function formatExamNote(exam: Exam, options: ExamNoteOptions = {}): string {
  const e = exam.estimate
  const sensor = exam.inclinationSource === 'sensor' ? 'measured by phone sensor' : 'entered'
  const lines = [
    `Bedside JVP exam, patient ${exam.patientCode}`,
    `Examined ${examinedText(exam.examinedAt, options.timeZone)} by ${exam.examinerName} (${exam.teamName}).`,
    `Position: trunk at ${exam.inclinationDeg}° from horizontal (${sensor}); ${VEIN_LABEL[exam.vein]} vein.`,
    columnLine(exam),
    estimateLine(e),
    modelLine(e),
    interpretationLine(e),
    pulsationLine(exam),
    findingsLine(exam),
    ...e.hints.map((hint) => `Consider ${hint.consider} (${hint.finding.toLowerCase()}).`),
    exam.notes.trim() ? `Notes: ${exam.notes.trim()}` : null,
    `Record: ${STATUS_LABEL[exam.status].toLowerCase()}, version ${exam.version}.`,
    ...(exam.signatures ?? []).map(signatureText),
    `Caution: ${CAUTION_TEXT}`,
  ]
  return lines.filter((line) => line !== null).join('\n')
}

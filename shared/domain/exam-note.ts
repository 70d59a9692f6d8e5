import type { Exam } from '../schemas/exam.ts'
import type { EstimateSettings } from '../schemas/settings.ts'
import { formatDateTimeZone } from './date-time.ts'
import { STATUS_LABEL, VEIN_LABEL } from './exam-labels.ts'
import { columnLine, estimateLine, findingsLine, interpretationLine, modelLine, venousSignsLine } from './exam-note-lines.ts'
import { promptStatement } from './estimate-text.ts'
import { CAUTION_TEXT } from './interpretation.ts'
import { signatureText } from './signature-text.ts'

export { STATUS_LABEL, VEIN_LABEL, VENOUS_SIGN_ABSENT_LABEL, VENOUS_SIGN_LABEL } from './exam-labels.ts'
export { bandText, oneDp } from './number-text.ts'

export interface ExamNoteOptions {
  /** IANA zone for the exam time; the runtime's own zone when omitted. */
  timeZone?: string
  /** The reader's locale (BCP 47) for the exam time; the runtime's own when omitted. */
  locale?: string
  /** Add Plumbline's prompts (each labelled, with its differential); left out unless the clinician adds them. */
  includePrompts?: boolean
  /** The settings the estimate was computed with, for the elevated threshold; the defaults when omitted. */
  settings?: EstimateSettings
}

/** Arterial evidence and too few venous signs are warnings; the other cautions are notes on how to read the number. */
function cautionLines(exam: Exam): { first: string[]; rest: string[] } {
  const line = (c: Exam['estimate']['cautions'][number]) =>
    `${c.code === 'arterial-evidence' || c.code === 'few-venous-signs' ? 'Warning' : 'Note'}: ${c.text}`
  const cautions = exam.estimate.cautions
  return { first: cautions.filter((c) => c.code === 'arterial-evidence').map(line), rest: cautions.filter((c) => c.code !== 'arterial-evidence').map(line) }
}

/**
 * A concise plain-text summary of an exam for pasting into a health record: arterial evidence before the estimate,
 * the elevated and category statements, every measurement caution and countersignature; the caution comes last.
 */
export function formatExamNote(exam: Exam, options: ExamNoteOptions = {}): string {
  const e = exam.estimate
  const sensor = exam.inclinationSource === 'sensor' ? 'measured by phone sensor' : 'entered'
  const cautions = cautionLines(exam)
  const prompts = options.includePrompts && e.prompts.length ? ['Prompts from Plumbline (to consider, not findings):', ...e.prompts.map(promptStatement)] : []
  const lines = [
    `Bedside JVP exam, patient ${exam.patientCode}`,
    `Examined ${formatDateTimeZone(exam.examinedAt, options)} by ${exam.examinerName} (${exam.teamName}).`,
    `Position: trunk at ${exam.inclinationDeg}° from horizontal (${sensor}); ${VEIN_LABEL[exam.vein]} vein.`,
    columnLine(exam),
    ...cautions.first,
    estimateLine(e),
    modelLine(e),
    interpretationLine(e, options.settings),
    ...cautions.rest,
    venousSignsLine(exam),
    findingsLine(exam),
    ...prompts,
    exam.notes.trim() ? `Notes: ${exam.notes.trim()}` : null,
    `Record: ${STATUS_LABEL[exam.status].toLowerCase()}, version ${exam.version}.`,
    ...(exam.signatures ?? []).map(signatureText),
    `Caution: ${CAUTION_TEXT}`,
  ]
  return lines.filter((line) => line !== null).join('\n')
}

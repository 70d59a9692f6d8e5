import { AID_NOTE, body, dateTimeText, examLink, examText, link, scrub, type ExamRef, type MailMessage, type TemplateContext } from './template-parts.ts'

export { invitation, passwordReset } from './account-templates.ts'
export type { ExamRef, TemplateContext } from './template-parts.ts'

export const MEANING_TEXT = {
  'reviewed-agree': 'reviewed, agrees with the findings',
  'reviewed-re-examined': 'reviewed after re-examining the patient',
} as const
export type SignatureMeaning = keyof typeof MEANING_TEXT

/** To the team's attendings, when a resident submits an exam. */
export function countersignRequested(p: TemplateContext & { to: string[]; residentName: string; exam: ExamRef }): MailMessage {
  return {
    template: 'countersign-requested',
    to: p.to,
    subject: `Countersignature requested by ${p.residentName}`,
    text: body(
      `${p.residentName} asks you to review and countersign ${examText(p.exam, p.timeZone, p.locale)}.`,
      `Open it in Plumbline: ${examLink(p.baseUrl, p.exam)}`,
      AID_NOTE,
    ),
  }
}

/** To the resident, when an attending returns their exam with a comment. */
export function examReturned(p: TemplateContext & { to: string; attendingName: string; comment: string; exam: ExamRef }): MailMessage {
  return {
    template: 'exam-returned',
    to: [p.to],
    subject: `Exam returned by ${p.attendingName}`,
    text: body(
      `${p.attendingName} returned ${examText(p.exam, p.timeZone, p.locale)} for changes, with this comment:`,
      scrub(p.comment, p.exam.patientCode),
      `Amend and resubmit it in Plumbline: ${examLink(p.baseUrl, p.exam)}`,
      AID_NOTE,
    ),
  }
}

/** The attending's own reading and teaching feedback given with a countersignature, as the e-mail words them. */
export interface TeachingText {
  /** e.g. "column top 6 cm above the sternal angle at 45°, CVP 13.1 cmH₂O; your estimate minus theirs: −2.0 cmH₂O" */
  reading: string | null
  feedback: string[]
}

function teachingParagraphs(p: { signerName: string; teaching?: TeachingText; exam: ExamRef }): string[] {
  if (!p.teaching) return []
  const reading = p.teaching.reading ? [`${p.signerName} examined the patient too: ${p.teaching.reading}.`] : []
  const feedback = p.teaching.feedback.map((line) => `- ${scrub(line, p.exam.patientCode)}`)
  return [...reading, ...(feedback.length ? [`Feedback from ${p.signerName}:\n${feedback.join('\n')}`] : [])]
}

/** To the resident, when an attending countersigns their exam. */
export function examCountersigned(
  p: TemplateContext & {
    to: string
    signerName: string
    meaning: SignatureMeaning
    signedAt: Date | string
    exam: ExamRef
    teaching?: TeachingText
  },
): MailMessage {
  return {
    template: 'exam-countersigned',
    to: [p.to],
    subject: `Exam countersigned by ${p.signerName}`,
    text: body(
      `${p.signerName} countersigned ${examText(p.exam, p.timeZone, p.locale)}.`,
      `Signed by ${p.signerName}, ${dateTimeText(p.signedAt, p.timeZone, p.locale)}, meaning: ${MEANING_TEXT[p.meaning]}.`,
      ...teachingParagraphs(p),
      `See the signed record in Plumbline: ${examLink(p.baseUrl, p.exam)}`,
      AID_NOTE,
    ),
  }
}

/** To each examiner named in a calibration round. */
export function roundOpened(
  p: TemplateContext & { to: string[]; educatorName: string; roundName: string; roundId: string; closesAt?: Date | string },
): MailMessage {
  const closes = p.closesAt ? ` It closes ${dateTimeText(p.closesAt, p.timeZone, p.locale)}.` : ''
  return {
    template: 'round-opened',
    to: p.to,
    subject: `Calibration round open: ${p.roundName}`,
    text: body(
      `${p.educatorName} opened the calibration round "${p.roundName}" and named you as an examiner.${closes}`,
      "Record your own reading of each patient; you will see the others' readings only once the round closes.",
      `Open the round in Plumbline: ${link(p.baseUrl, `/rounds/${encodeURIComponent(p.roundId)}`)}`,
      AID_NOTE,
    ),
  }
}

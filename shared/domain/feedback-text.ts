import type { FeedbackCode } from '../schemas/signature.ts'

/** How each point of teaching feedback reads to the resident, on screen and in the e-mail (product wording). */
export const FEEDBACK_LABEL: Record<FeedbackCode, string> = {
  'carotid-mistaken': 'The pulsation read was likely the carotid, not the vein',
  'wrong-reference-point': 'Measure from the sternal angle',
  position: 'Check the position: head supported, trunk at the stated angle',
  'read-peak-not-mean': 'Read the mean level of the column, not its peak',
  'not-at-end-expiration': 'Read at end-expiration',
  other: 'Other',
}

/** The codes as a list of readable lines, with the free text in place of "Other". */
export function feedbackLines(codes: readonly FeedbackCode[], text: string | null | undefined): string[] {
  const lines = codes.filter((c) => c !== 'other').map((c) => FEEDBACK_LABEL[c])
  if (text) lines.push(text)
  return lines
}

import { NOT_ASSESSABLE_LABEL } from '#shared/domain/exam-labels'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { signatureText } from '#shared/domain/signature-text'
import type { Bound, Exam } from '#shared/schemas/exam'
import type { EstimateStatements } from './exam-statements.ts'

const BOUND_NOTE: Record<Bound, string | null> = {
  point: null,
  lower: 'The top of the venous column was above the visible neck: the estimate is a lower bound (CVP at least this value).',
  upper: 'No venous column was seen even lying flat: the estimate is an upper bound (CVP at most the offset at this inclination).',
  none: 'The top of the venous column could not be assessed: there is no estimate.',
}

const OUTSIDE_RANGE_NOTE = 'The inclination lies above 60°, beyond the angles the offset was studied at (Seth et al. 2002).'

function boundNote(exam: Exam): string | null {
  const note = BOUND_NOTE[exam.estimate.bound]
  // The free text given with `other` stays out of exports, as the exam's notes do.
  const reason = exam.columnTop === 'not-assessable' && exam.notAssessableReason ? NOT_ASSESSABLE_LABEL[exam.notAssessableReason] : null
  return note && reason ? `${note} Reason: ${reason}.` : note
}

/**
 * `Observation.note`, in order: the caution, the arterial warning, the elevated and category statements, the frame
 * note, the bound, the other measurement cautions, a changed band, and every countersignature's manifestation
 * (21 CFR 11.50). Prompts from Plumbline are never sent: they are not findings.
 */
export function notesOf(exam: Exam, s: EstimateStatements): { text: string }[] {
  const e = exam.estimate
  // A first-rules estimate has no caution for the studied range; its flag is worded here as it was then.
  const outsideRange = e.outsideStudiedRange && !e.cautions.some((c) => c.code === 'outside-studied-range') ? OUTSIDE_RANGE_NOTE : null
  const lines = [
    CAUTION_TEXT,
    s.arterialWarning,
    s.elevated,
    s.category && `Estimated CVP category: ${s.category} (the categories the 95% band reaches).`,
    s.frameNote,
    boundNote(exam),
    ...s.otherCautions,
    outsideRange,
    s.reviewedNote,
    ...(exam.signatures ?? []).map(signatureText),
  ]
  return lines.filter((text): text is string => !!text).map((text) => ({ text }))
}

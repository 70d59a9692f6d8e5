import type { Exam } from '#shared/schemas/exam'
import { DraftFieldsSchema, type DraftRow } from './draft-schema'

const REVIEW_STEP = 4

/**
 * A draft holding a stored exam, to change it on this device; the draft id is the exam id. What the flow asked to
 * confirm before the exam was saved (the trunk angle after a phone reading, a column above the neck below 60°) stays
 * confirmed.
 */
export function draftFromExam(exam: Exam, previous?: DraftRow): DraftRow {
  const now = new Date().toISOString()
  const confirmed = { inclinationConfirmed: true, aboveNeckConfirmedDeg: exam.columnTop === 'above-neck' ? exam.inclinationDeg : null }
  return {
    id: exam.id,
    fields: { ...DraftFieldsSchema.parse(exam), ...confirmed },
    step: previous?.step ?? REVIEW_STEP,
    state: 'saved',
    createdAt: previous?.createdAt ?? now,
    updatedAt: now,
  }
}

import type { Exam } from '#shared/schemas/exam'
import { DraftFieldsSchema, type DraftRow } from './draft-schema'

const REVIEW_STEP = 4

/** A draft holding a stored exam, to change it on this device; the draft id is the exam id. */
export function draftFromExam(exam: Exam, previous?: DraftRow): DraftRow {
  const now = new Date().toISOString()
  return {
    id: exam.id,
    fields: DraftFieldsSchema.parse(exam),
    step: previous?.step ?? REVIEW_STEP,
    state: 'saved',
    createdAt: previous?.createdAt ?? now,
    updatedAt: now,
  }
}

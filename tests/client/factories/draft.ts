import { DEFAULT_APP_SETTINGS } from '#shared/schemas/settings'
import { ExamFindingsSchema, type ExamFindings, type ExamFindingsInput } from '#shared/schemas/exam'
import { newDraft, type DraftFields, type DraftRow } from '@/db/draft-schema'

/** The worked example: vertical 4 cm at 45°, ruler, incline-adjusted, right internal, three venous signs present. */
export const WORKED_EXAMPLE: DraftFields = {
  patientCode: 'SM-0142',
  teamId: 't-1',
  inclinationDeg: 45,
  vein: 'right-internal',
  venousSigns: { 'not-palpable': 'present', 'double-peaked': 'present', 'falls-on-inspiration': 'present' },
  columnTop: 'seen',
  heightMethod: 'vertical',
  heightCm: 4,
  readingPrecision: 'ruler',
}

export function makeDraft(fields: DraftFields = {}, overrides: Partial<DraftRow> = {}): DraftRow {
  const row = newDraft([{ id: 't-1', name: 'Cardiology A' }], DEFAULT_APP_SETTINGS.defaultOffsetModel)
  return { ...row, ...overrides, fields: { ...row.fields, ...fields } }
}

export function makeFindings(overrides: Partial<ExamFindingsInput> = {}): ExamFindings {
  return ExamFindingsSchema.parse({ ...WORKED_EXAMPLE, ...overrides })
}

import { ExamFindingsSchema, ExamFindingsShape, ExamInputSchema, type EstimateV2, type ExamFindings, type ExamInput, type ReviewedBand } from '#shared/schemas/exam'
import { computeEstimate } from '#shared/domain/estimate'
import type { DraftFields, DraftRow } from '@/db/draft-schema'
import type { EstimateBasis } from '@/db/local-exams'
import { flowErrors } from './bedside-checks'
import { draftInput } from './bedside-input'

type FieldName = keyof DraftFields

/** The flow's steps in order, each with the record fields (and the flow's own confirmations) it asks for. */
export const BEDSIDE_STEPS: readonly { title: string; fields: readonly FieldName[] }[] = [
  { title: 'Patient and position', fields: ['roundId', 'patientCode', 'teamId', 'examinedAt', 'inclinationDeg', 'inclinationSource', 'inclinationConfirmed', 'vein'] },
  { title: 'Pulsation', fields: ['venousSigns', 'rhythm'] },
  {
    title: 'Height',
    fields: ['columnTop', 'heightMethod', 'heightCm', 'alongNeckCm', 'readingPrecision', 'notAssessableReason', 'notAssessableText', 'aboveNeckConfirmedDeg'],
  },
  { title: 'Waveform and manoeuvres', fields: ['waveform', 'respiratory', 'abdominojugular', 'context', 'notes'] },
  { title: 'Review', fields: ['offsetModel', 'venousConfirmed'] },
]
export const LAST_STEP = BEDSIDE_STEPS.length - 1

/** The step holding a field, from an error key such as `abdominojugular.riseCm`; unknown keys go to the review. */
export function stepOfField(key: string): number {
  const name = key.split('.')[0] as FieldName
  const index = BEDSIDE_STEPS.findIndex((step) => step.fields.includes(name))
  return index === -1 ? LAST_STEP : index
}

// Valid stand-ins for the other steps' fields: zod skips the refinements while any other field fails.
const STAND_INS: Record<string, unknown> = {
  patientCode: 'X',
  teamId: 'x',
  examinedAt: '2000-01-01T00:00:00Z',
  inclinationDeg: 45,
  vein: 'right-internal',
  columnTop: 'not-assessable',
  notAssessableReason: 'habitus',
}

// The height step's checks read the inclination of the first step (along the neck, "not filled"): a valid one is used.
function readInclination(input: Record<string, unknown>) {
  const parsed = ExamFindingsShape.inclinationDeg.safeParse(input.inclinationDeg)
  return parsed.success ? { inclinationDeg: parsed.data } : {}
}

function errorsOfStep(input: Record<string, unknown>, step: number): Record<string, string> {
  const own = Object.fromEntries(BEDSIDE_STEPS[step]!.fields.map((name) => [name, input[name]]))
  const result = ExamInputSchema.safeParse({ ...STAND_INS, ...readInclination(input), id: input.id, ...own })
  const errors: Record<string, string> = {}
  for (const issue of result.error?.issues ?? []) {
    const key = issue.path.join('.')
    if (stepOfField(key) === step) errors[key] ??= issue.message
  }
  return errors
}

/** Field errors of every step, keyed by field path: the shared exam schema's, then the flow's own confirmations. */
export function draftErrors(row: Pick<DraftRow, 'id' | 'fields'>): Record<string, string> {
  const input = draftInput(row)
  const schema = Object.assign({}, ...BEDSIDE_STEPS.map((_, step) => errorsOfStep(input, step))) as Record<string, string>
  return { ...flowErrors(row.fields), ...schema }
}

// An unticked box is as unanswered as an empty field: its error waits until the step was attempted.
function filled(value: unknown) {
  return value !== undefined && value !== null && value !== '' && value !== false
}

/** The errors worth showing: a typed value's at once, an empty field's only once its step was attempted. */
export function errorsToShow(errors: Record<string, string>, fields: DraftFields, attemptedSteps: readonly number[]) {
  const values = fields as Record<string, unknown>
  return Object.fromEntries(
    Object.entries(errors).filter(([key]) => attemptedSteps.includes(stepOfField(key)) || filled(values[key.split('.')[0]!])),
  )
}

/** The whole draft as a valid exam input, or null while any field needs attention. */
export function parseDraft(row: Pick<DraftRow, 'id' | 'fields'>): ExamInput | null {
  const result = ExamInputSchema.safeParse(draftInput(row))
  return result.success ? result.data : null
}

/** The findings when they parse; computed offline by the shared engine. */
export function draftFindings(row: Pick<DraftRow, 'id' | 'fields'>): ExamFindings | null {
  const result = ExamFindingsSchema.safeParse(draftInput(row))
  return result.success ? result.data : null
}

/**
 * The live estimate of a draft with the settings and the error term the server uses now (so the band reviewed here is
 * the band it stores), or null while the findings are incomplete.
 */
export function liveEstimate(row: Pick<DraftRow, 'id' | 'fields'>, basis: EstimateBasis): EstimateV2 | null {
  const findings = draftFindings(row)
  if (!findings) return null
  const estimate = computeEstimate(findings, { settings: basis.settings, observer: basis.observer })
  const { settingsVersion } = basis
  return settingsVersion === undefined ? estimate : { ...estimate, settingsVersion }
}

/** The band the examiner reviewed, sent with the save so the server can say when the band it stores differs. */
export function reviewedBand(estimate: EstimateV2): ReviewedBand {
  const { bandCmH2O, observerSource, settingsVersion } = estimate
  return settingsVersion === undefined ? { bandCmH2O, observerSource } : { bandCmH2O, observerSource, settingsVersion }
}

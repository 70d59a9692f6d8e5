import { ExamFindingsSchema, ExamInputSchema, type Estimate, type ExamFindings, type ExamInput } from '#shared/schemas/exam'
import { computeEstimate } from '#shared/domain/estimate'
import type { DraftFields, DraftRow } from '@/db/draft-schema'
import { estimateSettingsInUse } from '@/stores/settings'

type FieldName = keyof DraftFields

/** The flow's steps in order, each with the record fields it asks for. */
export const BEDSIDE_STEPS: readonly { title: string; fields: readonly FieldName[] }[] = [
  { title: 'Patient and position', fields: ['roundId', 'patientCode', 'teamId', 'examinedAt', 'inclinationDeg', 'inclinationSource', 'vein'] },
  { title: 'Pulsation', fields: ['venousSigns', 'rhythm'] },
  { title: 'Height', fields: ['columnTop', 'heightMethod', 'heightCm', 'alongNeckCm', 'readingPrecision'] },
  { title: 'Waveform and manoeuvres', fields: ['waveform', 'respiratory', 'abdominojugular', 'notes'] },
  { title: 'Review', fields: ['offsetModel'] },
]
export const LAST_STEP = BEDSIDE_STEPS.length - 1

/** The step holding a field, from an error key such as `abdominojugular.riseCm`; unknown keys go to the review. */
export function stepOfField(key: string): number {
  const name = key.split('.')[0] as FieldName
  const index = BEDSIDE_STEPS.findIndex((step) => step.fields.includes(name))
  return index === -1 ? LAST_STEP : index
}

/** The draft as the shared input schema expects it; an undone abdominojugular test sends no numbers. */
export function draftInput(row: Pick<DraftRow, 'id' | 'fields'>): Record<string, unknown> {
  const { abdominojugular, ...rest } = row.fields
  const done = abdominojugular?.done ?? false
  const test = done ? { done, riseCm: abdominojugular?.riseCm ?? undefined, sustained: abdominojugular?.sustained } : { done }
  return { ...rest, id: row.id, abdominojugular: test }
}

// Valid stand-ins for the other steps' fields: zod skips the height refinement while any other field fails.
const STAND_INS: Record<string, unknown> = {
  patientCode: 'X',
  teamId: 'x',
  examinedAt: '2000-01-01T00:00:00Z',
  inclinationDeg: 45,
  vein: 'right-internal',
  columnTop: 'not-assessable',
}

function errorsOfStep(input: Record<string, unknown>, step: number): Record<string, string> {
  const own = Object.fromEntries(BEDSIDE_STEPS[step]!.fields.map((name) => [name, input[name]]))
  const result = ExamInputSchema.safeParse({ ...STAND_INS, id: input.id, ...own })
  const errors: Record<string, string> = {}
  for (const issue of result.error?.issues ?? []) {
    const key = issue.path.join('.')
    if (stepOfField(key) === step) errors[key] ??= issue.message
  }
  return errors
}

/** Field errors of every step, keyed by field path, judged by the shared exam schema. */
export function draftErrors(row: Pick<DraftRow, 'id' | 'fields'>): Record<string, string> {
  const input = draftInput(row)
  return Object.assign({}, ...BEDSIDE_STEPS.map((_, step) => errorsOfStep(input, step)))
}

function filled(value: unknown) {
  return value !== undefined && value !== null && value !== ''
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

/** The live estimate of a draft under the settings in use, or null while the findings are incomplete. */
export function liveEstimate(row: Pick<DraftRow, 'id' | 'fields'>): Estimate | null {
  const findings = draftFindings(row)
  return findings ? computeEstimate(findings, { settings: estimateSettingsInUse() }) : null
}

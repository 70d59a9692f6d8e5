import type { DraftFields } from '@/db/draft-schema'

type FieldName = keyof DraftFields

/** Fields inside the folded panel: an error in one of them opens it. */
export const FOLDED_FIELDS: readonly FieldName[] = [
  'rhythm',
  'examinedAt',
  'waveform',
  'respiratory',
  'abdominojugular',
  'context',
  'notes',
]

/** Fields the quick screen shows where they are entered, each with its own error. */
const PLACED_FIELDS: readonly FieldName[] = [
  ...FOLDED_FIELDS,
  'roundId',
  'patientCode',
  'teamId',
  'inclinationDeg',
  'inclinationConfirmed',
  'vein',
  'venousSigns',
  'venousConfirmed',
  'columnTop',
  'heightMethod',
  'heightCm',
  'alongNeckCm',
  'readingPrecision',
  'notAssessableReason',
  'notAssessableText',
  'aboveNeckConfirmedDeg',
]

const nameOf = (key: string) => key.split('.')[0] as FieldName

/** Whether any error belongs to a folded field. */
export function foldedError(errors: Record<string, string>): boolean {
  return Object.keys(errors).some((key) => FOLDED_FIELDS.includes(nameOf(key)))
}

/** Errors with no field on the quick screen (the record id, the body as a whole), to show beside the actions. */
export function unplacedErrors(errors: Record<string, string>): string[] {
  return Object.entries(errors)
    .filter(([key]) => !PLACED_FIELDS.includes(nameOf(key)))
    .map(([, message]) => message)
}

import { hasArterialEvidence } from '#shared/domain/estimate'
import { ABOVE_NECK_SIT_UP_BELOW_DEG, NO_VENOUS_SIGNS, VenousSignsSchema, type VenousSigns } from '#shared/schemas/exam'
import { requiredVenousSigns, venousSignCount } from '#shared/domain/venous-signs'
import { venousShortfallText } from '#shared/domain/caution-text'
import type { DraftFields } from '@/db/draft-schema'

/** Messages of the confirmations the flow asks for, keyed like field errors. */
export const FLOW_MESSAGES = {
  inclinationConfirmed: 'The phone measured the bed back: confirm the trunk is at this angle, or enter the trunk angle',
  aboveNeckConfirmedDeg: `Below ${ABOVE_NECK_SIT_UP_BELOW_DEG}° the top may come into view once the patient sits up: sit them up and look again, or confirm the top stays above the visible neck`,
  venousConfirmed:
    'Arterial evidence was recorded: confirm that the column you measured is venous before saving, or go back and examine again',
} as const

/** Whether the flow still waits for the examiner to confirm a column above the neck at a low inclination. */
export function sitUpAsked(fields: DraftFields): boolean {
  const angle = fields.inclinationDeg
  if (fields.columnTop !== 'above-neck' || typeof angle !== 'number' || angle >= ABOVE_NECK_SIT_UP_BELOW_DEG) return false
  return fields.aboveNeckConfirmedDeg !== angle
}

/** Every sign with its state as recorded so far (an unanswered sign is not tested). */
export function signsOf(fields: DraftFields): VenousSigns {
  const signs = VenousSignsSchema.safeParse(fields.venousSigns ?? {})
  return signs.success ? signs.data : NO_VENOUS_SIGNS
}

/** Whether the signs recorded so far hold arterial evidence (a palpable or non-obliterable pulsation). */
export function arterialEvidenceIn(fields: DraftFields): boolean {
  return hasArterialEvidence({ venousSigns: signsOf(fields) })
}

/**
 * The confirmations the flow needs before it saves, beyond what the record's schema checks: the trunk angle after a
 * phone reading (the phone lies on the bed back, not the chest), a column above the neck below 60°, and the column
 * confirmed venous when a palpable or non-obliterable pulsation was recorded (Cook & Simel 1996, JAMA 275:630–634).
 */
export function flowErrors(fields: DraftFields): Record<string, string> {
  const errors: Record<string, string> = {}
  if (fields.inclinationSource === 'sensor' && fields.inclinationConfirmed !== true)
    errors.inclinationConfirmed = FLOW_MESSAGES.inclinationConfirmed
  if (sitUpAsked(fields)) errors.aboveNeckConfirmedDeg = FLOW_MESSAGES.aboveNeckConfirmedDeg
  if (arterialEvidenceIn(fields) && fields.venousConfirmed !== true) errors.venousConfirmed = FLOW_MESSAGES.venousConfirmed
  return errors
}

/**
 * What the venous signs fall short of, in words, or null: the same count and cut-off as the result, with fewer signs
 * needed when the rhythm or breathing makes some absent (`minVenousSigns`, the admin's setting).
 */
export function venousShortfall(fields: DraftFields, minVenousSigns: number): string | null {
  const venousSigns = signsOf(fields)
  const { rhythm = 'unknown', respiratory = 'not-assessed' } = fields
  const present = venousSignCount({ venousSigns })
  const required = requiredVenousSigns({ venousSigns, rhythm, respiratory }, minVenousSigns)
  return present < required ? venousShortfallText(present, required, minVenousSigns) : null
}

/** A height is asked for when the top was seen or lies above the neck (a lower bound). */
export const columnMeasured = (fields: DraftFields) => fields.columnTop === 'seen' || fields.columnTop === 'above-neck'

/** The height is read straight up from the sternal angle unless the examiner chose another way. */
export const heightVertical = (fields: DraftFields) => (fields.heightMethod ?? 'vertical') === 'vertical'

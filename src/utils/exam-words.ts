import { VEIN_LABEL, VENOUS_SIGN_LABEL, oneDp } from '#shared/domain/exam-note'
import type { Abdominojugular, ColumnTop, Exam, NotAssessableReason, VenousSignState } from '#shared/schemas/exam'

type Respiratory = Exam['respiratory']

/** The column top as the findings show it. */
export const COLUMN_TOP_WORDS: Record<ColumnTop, string> = {
  seen: 'Seen',
  'above-neck': 'Above the visible neck, even upright',
  'not-filled': 'Not filled, even lying flat',
  'not-assessable': 'Could not be assessed',
}

/** The column's movement with breathing as the findings show it. */
export const RESPIRATORY_WORDS: Record<Respiratory, string> = {
  'falls-on-inspiration': 'Falls on inspiration',
  'rises-on-inspiration': 'Rises on inspiration (Kussmaul sign)',
  'no-change': 'No change with breathing',
  'not-assessed': 'Not assessed',
}

/** Why a column could not be assessed, as the findings show it. */
export const NOT_ASSESSABLE_WORDS: Record<NotAssessableReason, string> = {
  habitus: 'Body habitus',
  'lines-or-dressings': 'Lines or dressings over the neck',
  'cannot-position': 'Patient could not be positioned',
  ventilated: 'Mechanical ventilation',
  agitated: 'Patient agitated or moving',
  other: 'Other',
}

export const VENOUS_SIGN_STATE_WORDS: Record<VenousSignState, string> = {
  present: 'present',
  absent: 'absent',
  'not-tested': 'not tested',
}

/** A stored keyword as words: "atrial-fibrillation" → "Atrial fibrillation". */
export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1).replace(/-/g, ' ')
}

/** The vein as the findings name it, e.g. "Right internal jugular". */
export function veinWords(vein: string): string {
  return capitalise(VEIN_LABEL[vein as keyof typeof VEIN_LABEL] ?? vein)
}

/** A venous sign's name as the form shows it, e.g. "Double-peaked". */
export function venousSignWords(sign: string): string {
  const label = VENOUS_SIGN_LABEL[sign as keyof typeof VENOUS_SIGN_LABEL] ?? sign
  return label.charAt(0).toUpperCase() + label.slice(1)
}

/** The abdominojugular test in words, e.g. "Done, rise 4.0 cm, sustained" or "Done, no rise". */
export function abdominojugularWords(aj: Abdominojugular): string {
  if (!aj.done) return 'Not done'
  if (aj.riseCm === 0) return 'Done, no rise'
  const rise = aj.riseCm === undefined ? 'rise not recorded' : `rise ${oneDp(aj.riseCm)} cm`
  const fall = aj.fallOnReleaseCm === undefined ? '' : `, fall on release ${oneDp(aj.fallOnReleaseCm)} cm`
  const sustained = aj.sustained === undefined ? '' : aj.sustained ? ', sustained' : ', not sustained'
  return `Done, ${rise}${sustained}${fall}`
}

import { z } from 'zod'
import { hasArterialEvidence } from '#shared/domain/estimate'
import { ExamFindingsShape } from '#shared/schemas/exam'
import { AppError } from '../errors.ts'
import type { ExamModel } from '../models/index.ts'
import { storedInput } from './exam-columns.ts'

// The findings as stored, without the refinements: a draft saved under earlier rules is still read for its signs.
const StoredFindingsSchema = z.object(ExamFindingsShape)

export const VENOUS_CONFIRMATION_MESSAGE =
  'The pulsation was palpable or persisted under light pressure, which suggests an arterial pulse: confirm that the column you measured is venous before submitting'

/**
 * A palpable pulsation, or one that light pressure at the base of the neck does not obliterate, is arterial evidence
 * (Cook & Simel 1996, JAMA 275:630–634): the exam goes for countersignature only once the examiner has confirmed
 * that the column is venous. Answers 400 with `fields.venousConfirmed`; nothing is written.
 */
export function checkVenousConfirmed(row: ExamModel): void {
  const findings = StoredFindingsSchema.parse(storedInput(row))
  if (!hasArterialEvidence(findings) || findings.venousConfirmed) return
  throw new AppError('venous-not-confirmed', 400, VENOUS_CONFIRMATION_MESSAGE, { venousConfirmed: VENOUS_CONFIRMATION_MESSAGE })
}

import { withoutFloatNoise } from '#shared/domain/units'
import { FeedbackCodeSchema, type Signature } from '#shared/schemas/signature'
import type { ExamModel, SignatureModel } from '../models/index.ts'

type Teaching = Pick<Signature, 'attendingReading' | 'feedback' | 'feedbackText'>

/** A point estimate: the column top seen, so the exam has a CVP and no open side. */
const pointCvp = (row: ExamModel): number | null => (row.columnTop === 'seen' ? row.cvpCmH2O : null)

/** The resident's estimate minus the attending's, cmH₂O; null when either is not a point estimate. */
export function readingDifference(exam: ExamModel, reading: ExamModel): number | null {
  const [mine, theirs] = [pointCvp(exam), pointCvp(reading)]
  return mine === null || theirs === null ? null : withoutFloatNoise(mine - theirs)
}

/** The attending's reading and feedback as a signature shows them; nothing when the signature has neither. */
export function teachingOf(signature: SignatureModel, exam: ExamModel, reading: ExamModel | undefined): Teaching {
  const teaching: Teaching = {}
  if (reading)
    teaching.attendingReading = {
      examId: reading.id,
      heightCm: reading.heightCm!,
      inclinationDeg: reading.inclinationDeg,
      examinedAt: reading.examinedAt.toISOString(),
      cvpCmH2O: pointCvp(reading),
      differenceCmH2O: readingDifference(exam, reading),
    }
  if (signature.feedback) teaching.feedback = FeedbackCodeSchema.array().parse(JSON.parse(signature.feedback))
  if (signature.feedbackText) teaching.feedbackText = signature.feedbackText
  return teaching
}

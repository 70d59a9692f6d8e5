import { feedbackLines } from '#shared/domain/feedback-text'
import { oneDp } from '#shared/domain/number-text'
import type { Signature } from '#shared/schemas/signature'
import type { TeachingText } from '../mail/templates.ts'

const signed = (value: number) => (value > 0 ? `+${oneDp(value)}` : value < 0 ? `−${oneDp(-value)}` : oneDp(0))

/** The reading and feedback of a countersignature in words for the resident's e-mail; undefined when it has neither. */
export function teachingText(s: Signature): TeachingText | undefined {
  const feedback = feedbackLines(s.feedback ?? [], s.feedbackText)
  const r = s.attendingReading
  if (!r && !feedback.length) return undefined
  const reading = r
    ? [
        `column top ${oneDp(r.heightCm)} cm above the sternal angle at ${oneDp(r.inclinationDeg)}°`,
        r.cvpCmH2O === null ? null : `estimated CVP ${oneDp(r.cvpCmH2O)} cmH₂O`,
        r.differenceCmH2O === null ? null : `your estimate minus theirs: ${signed(r.differenceCmH2O)} cmH₂O`,
      ]
        .filter(Boolean)
        .join('; ')
    : null
  return { reading, feedback }
}

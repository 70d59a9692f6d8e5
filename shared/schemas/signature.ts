import { z } from 'zod'

/** What the signer attests (21 CFR 11.50(a)(3)). */
export const SignatureMeaningSchema = z.enum(['reviewed-agree', 'reviewed-re-examined'])
export type SignatureMeaning = z.infer<typeof SignatureMeaningSchema>

const baseVersion = z.number('Send the version this action is based on').int().min(1).optional()

/** Structured teaching feedback an attending may give with a countersignature (common technique errors; product list). */
export const FeedbackCodeSchema = z.enum(['carotid-mistaken', 'wrong-reference-point', 'position', 'read-peak-not-mean', 'not-at-end-expiration', 'other'])
export type FeedbackCode = z.infer<typeof FeedbackCodeSchema>

/**
 * The attending's own findings at the same patient, required with `reviewed-re-examined`: stored as the attending's
 * own exam of that patient (same code, team and vein), so it pairs like any other exam. `examinedAt` defaults to the
 * time of signing.
 */
export const AttendingReadingSchema = z.object({
  heightCm: z.number('Enter the height you read').min(-10, 'Height is at least −10 cm').max(30, 'Height is at most 30 cm'),
  inclinationDeg: z.number('Enter the inclination').min(0, 'Inclination is 0° (flat) or more').max(90, 'Inclination is at most 90° (upright)'),
  examinedAt: z.iso.datetime({ offset: true, message: 'Use an ISO 8601 date-time' }).optional(),
})
export type AttendingReading = z.infer<typeof AttendingReadingSchema>

const countersignFields = {
  password: z.string('Enter your password').min(1, 'Enter your password').max(200),
  meaning: SignatureMeaningSchema,
  baseVersion,
  attendingReading: AttendingReadingSchema.optional(),
  feedback: z
    .array(FeedbackCodeSchema)
    .max(FeedbackCodeSchema.options.length)
    .transform((codes) => [...new Set(codes)])
    .optional(),
  feedbackText: z.string().trim().max(2000, 'Feedback is at most 2,000 characters').optional(),
}

/** Each countersignature is a full authentication: the password is checked again (21 CFR 11.200(a)). */
export const CountersignInputSchema = z.object(countersignFields).superRefine((value, ctx) => {
  if (value.meaning === 'reviewed-re-examined' && !value.attendingReading)
    ctx.addIssue({ code: 'custom', path: ['attendingReading'], message: 'Enter the height and inclination you found when you examined the patient' })
  if (value.feedback?.includes('other') && !value.feedbackText)
    ctx.addIssue({ code: 'custom', path: ['feedbackText'], message: 'Say what the other point of feedback is' })
})
export type CountersignInput = z.infer<typeof CountersignInputSchema>

export const ReturnInputSchema = z.object({
  comment: z
    .string('Say what needs changing')
    .trim()
    .min(1, 'Say what needs changing')
    .max(2000, 'A comment is at most 2,000 characters'),
  baseVersion,
})
export type ReturnInput = z.infer<typeof ReturnInputSchema>

export const AmendInputSchema = z.object({ baseVersion })
export type AmendInput = z.infer<typeof AmendInputSchema>

/** A signature as it must be shown (21 CFR 11.50): printed name, date and time with zone, meaning; and whether it still holds. */
export const SignatureSchema = z.object({
  id: z.string(),
  examId: z.string(),
  /** The exam version this signature is bound to. */
  examVersion: z.number().int(),
  signerId: z.string(),
  /** The signer's name as it was when they signed. */
  signerName: z.string(),
  meaning: SignatureMeaningSchema,
  /** Server time, ISO 8601 with the offset of `timeZone`. */
  signedAt: z.iso.datetime({ offset: true }),
  /** The server's IANA time zone, e.g. `Europe/London`. */
  timeZone: z.string(),
  /** SHA-256 (hex) of the canonical serialisation of the signed version. */
  hash: z.string(),
  /** True once the record was amended after signing; the signature stays on record. */
  superseded: z.boolean(),
  supersededAt: z.iso.datetime({ offset: true }).nullable(),
  /** The signed content still matches the hash: the live record for a current signature, the kept copy for a superseded one. */
  valid: z.boolean(),
  /** The attending's own reading (`reviewed-re-examined`), stored as their exam `examId`; absent otherwise. */
  attendingReading: z
    .object({
      examId: z.string(),
      heightCm: z.number(),
      inclinationDeg: z.number(),
      examinedAt: z.string(),
      cvpCmH2O: z.number().nullable(),
      /** The resident's estimate minus the attending's, cmH₂O; null when either has no point estimate. */
      differenceCmH2O: z.number().nullable(),
    })
    .nullish(),
  feedback: z.array(FeedbackCodeSchema).optional(),
  feedbackText: z.string().nullish(),
})
export type Signature = z.infer<typeof SignatureSchema>

export const SignatureListSchema = z.object({ signatures: z.array(SignatureSchema) })
export type SignatureList = z.infer<typeof SignatureListSchema>

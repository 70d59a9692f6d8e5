import { z } from 'zod'

/** What the signer attests (21 CFR 11.50(a)(3)). */
export const SignatureMeaningSchema = z.enum(['reviewed-agree', 'reviewed-re-examined'])
export type SignatureMeaning = z.infer<typeof SignatureMeaningSchema>

const baseVersion = z.number('Send the version this action is based on').int().min(1).optional()

/** Each countersignature is a full authentication: the password is checked again (21 CFR 11.200(a)). */
export const CountersignInputSchema = z.object({
  password: z.string('Enter your password').min(1, 'Enter your password').max(200),
  meaning: SignatureMeaningSchema,
  baseVersion,
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
})
export type Signature = z.infer<typeof SignatureSchema>

export const SignatureListSchema = z.object({ signatures: z.array(SignatureSchema) })
export type SignatureList = z.infer<typeof SignatureListSchema>

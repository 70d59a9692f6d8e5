import { z } from 'zod'
import { LandisKochLabelSchema, UnavailableSchema } from './agreement.ts'
import { PatientCodeSchema } from './exam.ts'
import { idField } from './fields.ts'

/** The most patient codes and examiners one round may name. */
export const ROUND_MAX_CODES = 40
export const ROUND_MAX_EXAMINERS = 20

export const RoundStatusSchema = z.enum(['open', 'closed'])
export type RoundStatus = z.infer<typeof RoundStatusSchema>

/** Issues on the repeated items of a list, keyed by their index, e.g. `patientCodes.2`. */
function uniqueItems(values: readonly string[], key: (v: string) => string, path: string, message: string, ctx: z.RefinementCtx) {
  const seen = new Set<string>()
  values.forEach((value, index) => {
    const k = key(value)
    if (seen.has(k)) ctx.addIssue({ code: 'custom', path: [path, index], message })
    seen.add(k)
  })
}

/**
 * `POST /api/rounds`: a name, the patients (by code) and the examiners (residents or attendings, by account id).
 * Codes are compared without regard to case, as the patient-code masking does. Whether the examiners exist and may
 * record exams is checked by the server.
 */
export const RoundCreateSchema = z
  .object({
    name: z.string('Name the round').trim().min(1, 'Name the round').max(120, 'A round name is at most 120 characters'),
    patientCodes: z
      .array(PatientCodeSchema, 'List the patient codes')
      .min(1, 'Name at least one patient code')
      .max(ROUND_MAX_CODES, `A round takes at most ${ROUND_MAX_CODES} patient codes`),
    examinerIds: z
      .array(idField('Choose an examiner'), 'Choose the examiners')
      .min(2, 'Choose at least two examiners: agreement needs two or more')
      .max(ROUND_MAX_EXAMINERS, `A round takes at most ${ROUND_MAX_EXAMINERS} examiners`),
  })
  .superRefine((round, ctx) => {
    uniqueItems(round.patientCodes, (c) => c.toUpperCase(), 'patientCodes', 'This patient code is already in the list', ctx)
    uniqueItems(round.examinerIds, (id) => id, 'examinerIds', 'This examiner is already in the list', ctx)
  })
export type RoundCreate = z.infer<typeof RoundCreateSchema>
export type RoundCreateInput = z.input<typeof RoundCreateSchema>

export const RoundPersonSchema = z.object({ id: z.string(), displayName: z.string() })
export type RoundPerson = z.infer<typeof RoundPersonSchema>

/** A round as lists show it: who, what, and how far along (recorded entries of the expected codes × examiners). */
export const RoundSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  status: RoundStatusSchema,
  createdBy: RoundPersonSchema,
  createdAt: z.string(),
  closedAt: z.string().nullable(),
  patientCodes: z.array(z.string()),
  examiners: z.array(RoundPersonSchema),
  recorded: z.number().int(),
  expected: z.number().int(),
  /**
   * Whether the patient codes in this response (and in every other response about the round) are keyed pseudonyms
   * (`P-xxxxxxxx`): true for anyone who is not one of the round's examiners, e.g. its educator, as for exams.
   */
  codesMasked: z.boolean(),
})
export type RoundSummary = z.infer<typeof RoundSummarySchema>

export const RoundListSchema = z.object({ rounds: z.array(RoundSummarySchema) })

/**
 * One cell of the progress grid. `recorded`: a submitted (non-draft) exam; `draft`: only a draft, shown to its author
 * alone; `missing`: nothing yet. The exam id and the height are shown to the entry's author, and to everyone in the
 * round once it is closed; before that they are null (blinding). The exam id also only where the viewer may read
 * that exam, with its code shown as the round shows it (so a code and its pseudonym are never seen side by side).
 */
export const RoundEntrySchema = z.object({
  examinerId: z.string(),
  patientCode: z.string(),
  state: z.enum(['recorded', 'draft', 'missing']),
  examId: z.string().nullable(),
  heightCm: z.number().nullable(),
})
export type RoundEntry = z.infer<typeof RoundEntrySchema>

export const RoundDetailSchema = RoundSummarySchema.extend({
  entries: z.array(RoundEntrySchema),
  /** Whether the viewer may close the round: its own educator, while it is open. */
  canClose: z.boolean(),
  /** Whether the viewer is one of its examiners. */
  isExaminer: z.boolean(),
})
export type RoundDetail = z.infer<typeof RoundDetailSchema>

const interval = z.tuple([z.number(), z.number()])
const orUnavailable = <T extends z.ZodType>(schema: T) => z.union([schema, UnavailableSchema])

/** A cell left out of the statistics: nothing submitted, or an exam without a measured height (column not seen). */
export const RoundMissingEntrySchema = z.object({
  examinerId: z.string(),
  examinerName: z.string(),
  patientCode: z.string(),
  reason: z.enum(['not-recorded', 'not-measured']),
})
export type RoundMissingEntry = z.infer<typeof RoundMissingEntrySchema>

/** Each examiner's mean deviation from the per-subject round mean, over the complete subjects. */
export const RoundExaminerBiasSchema = z.object({
  examinerId: z.string(),
  name: z.string(),
  /** Complete subjects the bias is taken over. */
  n: z.number().int(),
  /** Mean of (own height − the subject's mean of all examiners), cm; null without complete subjects. */
  bias: z.number().nullable(),
  /** SD of those deviations; null below 2 subjects. */
  sd: z.number().nullable(),
})
export type RoundExaminerBias = z.infer<typeof RoundExaminerBiasSchema>

/** A closed round's agreement on h above the sternal angle. */
export const RoundResultsSchema = z.object({
  roundId: z.string(),
  name: z.string(),
  closedAt: z.string().nullable(),
  subjects: z.number().int(),
  raters: z.number().int(),
  /** Patient codes every examiner measured: the subjects of the ICC and of Fleiss' kappa. */
  completeSubjects: z.number().int(),
  incompleteCodes: z.array(z.string()),
  missing: z.object({ count: z.number().int(), entries: z.array(RoundMissingEntrySchema) }),
  /** ICC(2,1) = ICC(A,1) over k raters, with its 95% CI. */
  icc: orUnavailable(z.object({ value: z.number(), ci: interval })),
  /** Fleiss' kappa on elevated (h above the threshold) / not elevated. */
  fleissElevated: orUnavailable(z.object({ value: z.number(), label: LandisKochLabelSchema })),
  elevatedAboveCm: z.number(),
  byExaminer: z.array(RoundExaminerBiasSchema),
  /** The measured heights after close: rows follow `patientCodes`, columns `examiners`; null where missing. */
  patientCodes: z.array(z.string()),
  examiners: z.array(RoundPersonSchema),
  heights: z.array(z.array(z.number().nullable())),
  /** As on the summary: the codes above are pseudonyms for anyone who is not one of the round's examiners. */
  codesMasked: z.boolean(),
  caution: z.string(),
})
export type RoundResults = z.infer<typeof RoundResultsSchema>

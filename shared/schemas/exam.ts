import { z } from 'zod'
import { SignatureSchema } from './signature.ts'
import { ApiErrorSchema } from './user.ts'

export const InclinationSourceSchema = z.enum(['entered', 'sensor'])
export const VeinSchema = z.enum(['right-internal', 'left-internal', 'right-external', 'left-external'])
export const ColumnTopSchema = z.enum(['seen', 'above-neck', 'not-filled', 'not-assessable'])
export const HeightMethodSchema = z.enum(['vertical', 'along-neck'])
export const ReadingPrecisionSchema = z.enum(['ruler', 'visual'])
export const OffsetModelSchema = z.enum(['incline-adjusted', 'fixed-5cm'])
export const VenousSignSchema = z.enum([
  'not-palpable',
  'double-peaked',
  'falls-on-inspiration',
  'changes-with-position',
  'rises-with-abdominal-pressure',
  'obliterated-by-light-pressure',
])
export const RhythmSchema = z.enum(['sinus', 'atrial-fibrillation', 'paced', 'other', 'unknown'])
export const AWaveSchema = z.enum(['normal', 'prominent', 'cannon', 'absent', 'unclear'])
export const VWaveSchema = z.enum(['normal', 'large', 'unclear'])
export const YDescentSchema = z.enum(['normal', 'steep', 'slow', 'blunted', 'unclear'])
export const RespiratorySchema = z.enum(['falls-on-inspiration', 'rises-on-inspiration', 'no-change', 'not-assessed'])
export const ExamStatusSchema = z.enum(['draft', 'submitted', 'countersigned', 'returned'])

export type Vein = z.infer<typeof VeinSchema>
export type ColumnTop = z.infer<typeof ColumnTopSchema>
export type HeightMethod = z.infer<typeof HeightMethodSchema>
export type OffsetModel = z.infer<typeof OffsetModelSchema>
export type VenousSign = z.infer<typeof VenousSignSchema>
export type ExamStatus = z.infer<typeof ExamStatusSchema>

const waveformFields = { aWave: AWaveSchema, vWave: VWaveSchema, yDescent: YDescentSchema }

export const WaveformSchema = z.object({
  aWave: AWaveSchema.default('unclear'),
  vWave: VWaveSchema.default('unclear'),
  yDescent: YDescentSchema.default('unclear'),
})
export type Waveform = z.infer<typeof WaveformSchema>

/** A change to some of the waveform findings; the rest keep their stored values. */
export const WaveformPatchSchema = z.object(waveformFields).partial()

export const AbdominojugularSchema = z.object({
  done: z.boolean(),
  riseCm: z.number().min(0, 'The rise cannot be negative').max(30, 'A rise above 30 cm is not plausible').optional(),
  sustained: z.boolean().optional(),
})
export type Abdominojugular = z.infer<typeof AbdominojugularSchema>

const findingsFields = {
  inclinationDeg: z.number('Enter the inclination in degrees').min(0, 'Inclination is 0° (flat) or more').max(90, 'Inclination is at most 90° (upright)'),
  inclinationSource: InclinationSourceSchema,
  vein: VeinSchema,
  columnTop: ColumnTopSchema,
  heightMethod: HeightMethodSchema,
  heightCm: z.number().min(-10, 'Height is at least −10 cm').max(30, 'Height is at most 30 cm').nullish(),
  alongNeckCm: z.number().min(0, 'Distance along the neck is 0 cm or more').max(40, 'Distance along the neck is at most 40 cm').nullish(),
  readingPrecision: ReadingPrecisionSchema,
  offsetModel: OffsetModelSchema,
  venousSigns: z.array(VenousSignSchema).max(6).transform((signs) => [...new Set(signs)]),
  rhythm: RhythmSchema,
  waveform: WaveformPatchSchema,
  respiratory: RespiratorySchema,
  abdominojugular: AbdominojugularSchema,
}

/** The clinical findings: everything the estimate is computed from, with the defaults a new exam starts from. */
export const ExamFindingsShape = {
  ...findingsFields,
  inclinationSource: findingsFields.inclinationSource.default('entered'),
  heightMethod: findingsFields.heightMethod.default('vertical'),
  readingPrecision: findingsFields.readingPrecision.default('ruler'),
  offsetModel: findingsFields.offsetModel.default('incline-adjusted'),
  venousSigns: findingsFields.venousSigns.default([]),
  rhythm: findingsFields.rhythm.default('unknown'),
  waveform: WaveformSchema.default({ aWave: 'unclear', vWave: 'unclear', yDescent: 'unclear' }),
  respiratory: findingsFields.respiratory.default('not-assessed'),
  abdominojugular: findingsFields.abdominojugular.default({ done: false }),
}

interface HeightFields {
  columnTop: ColumnTop
  heightMethod: HeightMethod
  heightCm?: number | null
  alongNeckCm?: number | null
}

/** A measured column needs the number its height method reads. */
function requireHeight(value: HeightFields, ctx: z.RefinementCtx) {
  if (value.columnTop !== 'seen' && value.columnTop !== 'above-neck') return
  if (value.heightMethod === 'vertical' && (value.heightCm === null || value.heightCm === undefined))
    ctx.addIssue({ code: 'custom', path: ['heightCm'], message: 'Enter the height of the column top above the sternal angle' })
  if (value.heightMethod === 'along-neck' && (value.alongNeckCm === null || value.alongNeckCm === undefined))
    ctx.addIssue({ code: 'custom', path: ['alongNeckCm'], message: 'Enter the distance measured along the neck' })
}

export const ExamFindingsSchema = z.object(ExamFindingsShape).superRefine(requireHeight)
export type ExamFindingsInput = z.input<typeof ExamFindingsSchema>
export type ExamFindings = z.infer<typeof ExamFindingsSchema>

export const PatientCodeSchema = z
  .string('Enter the patient code')
  .trim()
  .min(1, 'Enter the patient code')
  .max(40, 'A patient code is at most 40 characters')
  .regex(/^[A-Za-z0-9-]+$/, 'Use letters, digits and “-” only (never a name)')

const recordFields = {
  id: z.uuid('The record id must be a UUID'),
  patientCode: PatientCodeSchema,
  teamId: z.string('Choose a team').min(1, 'Choose a team'),
  examinedAt: z.iso.datetime({ offset: true, message: 'Enter the time of the exam' }),
  notes: z.string().max(2000, 'Notes are at most 2,000 characters'),
  /** The calibration round (§6) this exam is an entry of; null or absent for an ordinary exam. */
  roundId: z.string().min(1, 'Choose a calibration round').max(64, 'Choose a calibration round').nullish(),
}

const recordShape = { ...recordFields, notes: recordFields.notes.default(''), ...ExamFindingsShape }

/** What a client sends to create an exam. Unknown keys (status, version, estimate, examinerId) are dropped. */
export const ExamInputSchema = z.object(recordShape).superRefine(requireHeight)
export type ExamInput = z.infer<typeof ExamInputSchema>
export type ExamInputRaw = z.input<typeof ExamInputSchema>

/** A change to an existing exam: any record field but the id, with the version it was based on. */
export const ExamPatchSchema = z
  .object({ ...recordFields, ...findingsFields })
  .omit({ id: true })
  .partial()
  .extend({ baseVersion: z.number('Send the version this change is based on').int().min(1) })
export type ExamPatch = z.infer<typeof ExamPatchSchema>

export const BoundSchema = z.enum(['point', 'lower', 'upper', 'none'])
export const CvpCategorySchema = z.enum(['low', 'normal', 'high'])
export const ConfidenceSchema = z.enum(['clear', 'indeterminate'])
export const ObserverSourceSchema = z.enum(['default', 'local'])
export const HintCodeSchema = z.enum([
  'cannon-a-waves',
  'absent-a-waves',
  'large-v-waves',
  'steep-y-descent',
  'kussmaul-sign',
  'abdominojugular-positive',
  'left-sided-vein',
])
export type Bound = z.infer<typeof BoundSchema>
export type CvpCategory = z.infer<typeof CvpCategorySchema>

export const HintSchema = z.object({ code: HintCodeSchema, finding: z.string(), consider: z.string() })
export type Hint = z.infer<typeof HintSchema>

const bandSchema = z.tuple([z.number().nullable(), z.number().nullable()]).nullable()

/** §8's estimate object, plus the model used, the venous-sign count and warning, and the caution text. */
export const EstimateSchema = z.object({
  cvpCmH2O: z.number().nullable(),
  cvpMmHg: z.number().nullable(),
  bandCmH2O: bandSchema,
  bandMmHg: bandSchema,
  offsetCm: z.number(),
  offsetModel: OffsetModelSchema,
  heightCm: z.number().nullable(),
  sigmaCm: z.number().nullable(),
  bound: BoundSchema,
  elevated: z.boolean().nullable(),
  category: CvpCategorySchema.nullable(),
  confidence: ConfidenceSchema.nullable(),
  observerSource: ObserverSourceSchema,
  outsideStudiedRange: z.boolean(),
  venousSignCount: z.number().int(),
  mayBeArterial: z.boolean(),
  hints: z.array(HintSchema),
  caution: z.string(),
  /** The settings version whose thresholds and error terms the server used; absent before versioned settings (= version 1). */
  settingsVersion: z.number().int().min(1).optional(),
})
export type Estimate = z.infer<typeof EstimateSchema>

export const ExamSchema = z.object({
  ...recordShape,
  id: z.string(),
  examinerId: z.string(),
  examinerName: z.string(),
  teamName: z.string(),
  status: ExamStatusSchema,
  version: z.number().int(),
  estimate: EstimateSchema,
  createdAt: z.string(),
  updatedAt: z.string(),
  submittedAt: z.string().nullable(),
  /** Countersignatures, current and superseded, oldest first. */
  signatures: z.array(SignatureSchema).optional(),
  /** The attending's comment while a returned exam waits to be resubmitted. */
  returnComment: z.string().nullable().optional(),
})
export type Exam = z.infer<typeof ExamSchema>

export const ExamSortSchema = z.enum(['examinedAt', 'patientCode', 'status', 'heightCm', 'cvpCmH2O', 'updatedAt'])

export const ExamListQuerySchema = z.object({
  status: ExamStatusSchema.optional(),
  teamId: z.string().optional(),
  examinerId: z.string().optional(),
  patientCode: z.string().trim().max(40).optional(),
  from: z.iso.datetime({ offset: true, message: 'Use an ISO 8601 date-time' }).optional(),
  to: z.iso.datetime({ offset: true, message: 'Use an ISO 8601 date-time' }).optional(),
  sort: ExamSortSchema.default('examinedAt'),
  order: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
})
export type ExamListQuery = z.infer<typeof ExamListQuerySchema>

export const ExamListSchema = z.object({ exams: z.array(ExamSchema), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() })
export type ExamList = z.infer<typeof ExamListSchema>

/** A 409 on a stale or locked exam carries the server's copy. */
export const ExamConflictSchema = ApiErrorSchema.extend({ exam: ExamSchema })
export type ExamConflict = z.infer<typeof ExamConflictSchema>

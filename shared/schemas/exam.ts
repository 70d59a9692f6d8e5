import { z } from 'zod'
import { clientTime, idField, lineField, textField, uuidField } from './fields.ts'
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
/** How one venous sign was found: each sign of Cook & Simel's table (JAMA 1996;275:630–634) is recorded on its own. */
export const VenousSignStateSchema = z.enum(['present', 'absent', 'not-tested'])
/** Circumstances that change how the reading is read; each is shown beside the result. */
export const ContextFlagSchema = z.enum(['positive-pressure-ventilation', 'svc-obstruction-suspected', 'tense-ascites'])
export const NotAssessableReasonSchema = z.enum(['habitus', 'lines-or-dressings', 'cannot-position', 'ventilated', 'agitated', 'other'])
export const ExamStatusSchema = z.enum(['draft', 'submitted', 'countersigned', 'returned'])

export type Vein = z.infer<typeof VeinSchema>
export type ColumnTop = z.infer<typeof ColumnTopSchema>
export type HeightMethod = z.infer<typeof HeightMethodSchema>
export type OffsetModel = z.infer<typeof OffsetModelSchema>
export type VenousSign = z.infer<typeof VenousSignSchema>
export type VenousSignState = z.infer<typeof VenousSignStateSchema>
export type ContextFlag = z.infer<typeof ContextFlagSchema>
export type NotAssessableReason = z.infer<typeof NotAssessableReasonSchema>
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
  /** An abrupt fall on release of the pressure (Ewy 1988, Ann Intern Med 109:456–460). */
  fallOnReleaseCm: z.number().min(0, 'The fall cannot be negative').max(30, 'A fall above 30 cm is not plausible').optional(),
})
export type Abdominojugular = z.infer<typeof AbdominojugularSchema>

/** Every sign with its state; a sign that was not sent reads `not-tested`. */
export type VenousSigns = Record<VenousSign, VenousSignState>

function allSigns(given: Partial<Record<VenousSign, VenousSignState>>): VenousSigns {
  return Object.fromEntries(VenousSignSchema.options.map((sign) => [sign, given[sign] ?? 'not-tested'])) as VenousSigns
}

/** The older list form, still sent by devices and read from stored records: each listed sign was present. */
function fromSignList(value: unknown): unknown {
  if (!Array.isArray(value)) return value
  // A sign that is not text cannot be read; '' is no sign, so the record is refused with a field message.
  return Object.fromEntries(value.map((sign) => [typeof sign === 'string' ? sign : '', 'present']))
}

/** The venous signs keyed by sign (`{"not-palpable":"present"}`), or the older list of present signs. */
export const VenousSignsSchema = z.preprocess(fromSignList, z.partialRecord(VenousSignSchema, VenousSignStateSchema)).transform(allSigns)

/** Every sign not tested: what a new exam starts from. */
export const NO_VENOUS_SIGNS: VenousSigns = allSigns({})

/** A column "not filled even lying flat" is accepted only this flat (degrees). */
export const NOT_FILLED_MAX_DEG = 10
/** Below this inclination, sin θ makes a small angle error dominate a reading along the neck (degrees). */
export const ALONG_NECK_MIN_DEG = 30
/** Below this inclination, the flow asks to sit the patient up before accepting a column above the neck (degrees). */
export const ABOVE_NECK_SIT_UP_BELOW_DEG = 60

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
  venousSigns: VenousSignsSchema,
  /** The examiner's explicit confirmation that the column is venous; required to submit when arterial evidence was recorded. */
  venousConfirmed: z.boolean(),
  rhythm: RhythmSchema,
  waveform: WaveformPatchSchema,
  respiratory: RespiratorySchema,
  abdominojugular: AbdominojugularSchema,
  notAssessableReason: NotAssessableReasonSchema.nullish(),
  notAssessableText: textField(200, 'The reason is at most 200 characters').trim().nullish(),
  context: z.array(ContextFlagSchema).max(3).transform((flags) => [...new Set(flags)]),
}

/** The clinical findings: everything the estimate is computed from, with the defaults a new exam starts from. */
export const ExamFindingsShape = {
  ...findingsFields,
  inclinationSource: findingsFields.inclinationSource.default('entered'),
  heightMethod: findingsFields.heightMethod.default('vertical'),
  readingPrecision: findingsFields.readingPrecision.default('ruler'),
  offsetModel: findingsFields.offsetModel.default('incline-adjusted'),
  venousSigns: findingsFields.venousSigns.default(NO_VENOUS_SIGNS),
  venousConfirmed: findingsFields.venousConfirmed.default(false),
  context: findingsFields.context.default([]),
  rhythm: findingsFields.rhythm.default('unknown'),
  waveform: WaveformSchema.default({ aWave: 'unclear', vWave: 'unclear', yDescent: 'unclear' }),
  respiratory: findingsFields.respiratory.default('not-assessed'),
  abdominojugular: findingsFields.abdominojugular.default({ done: false }),
}

interface CheckedFields {
  inclinationDeg: number
  columnTop: ColumnTop
  heightMethod: HeightMethod
  heightCm?: number | null
  alongNeckCm?: number | null
  notAssessableReason?: NotAssessableReason | null
  notAssessableText?: string | null
}

/** A measured column needs the number its height method reads; along the neck only from 30° up. */
function requireHeight(value: CheckedFields, ctx: z.RefinementCtx) {
  if (value.columnTop !== 'seen' && value.columnTop !== 'above-neck') return
  if (value.heightMethod === 'vertical' && (value.heightCm === null || value.heightCm === undefined))
    ctx.addIssue({ code: 'custom', path: ['heightCm'], message: 'Enter the height of the column top above the sternal angle' })
  if (value.heightMethod === 'along-neck' && (value.alongNeckCm === null || value.alongNeckCm === undefined))
    ctx.addIssue({ code: 'custom', path: ['alongNeckCm'], message: 'Enter the distance measured along the neck' })
  if (value.heightMethod === 'along-neck' && value.inclinationDeg < ALONG_NECK_MIN_DEG)
    ctx.addIssue({
      code: 'custom',
      path: ['heightMethod'],
      message: `Below ${ALONG_NECK_MIN_DEG}° a reading along the neck is unreliable: hold a ruler vertical at the sternal angle and enter the vertical height`,
    })
}

/** "Not filled" only when lying (nearly) flat; "not assessable" always with its reason. */
function requireColumnContext(value: CheckedFields, ctx: z.RefinementCtx) {
  if (value.columnTop === 'not-filled' && value.inclinationDeg > NOT_FILLED_MAX_DEG)
    ctx.addIssue({
      code: 'custom',
      path: ['columnTop'],
      message: `"No column even lying flat" needs the bed at ${NOT_FILLED_MAX_DEG}° or flatter: lower the bed and look again, or record the column as not assessable with a reason`,
    })
  if (value.columnTop !== 'not-assessable') return
  if (!value.notAssessableReason) ctx.addIssue({ code: 'custom', path: ['notAssessableReason'], message: 'Say why the column could not be assessed' })
  else if (value.notAssessableReason === 'other' && !value.notAssessableText)
    ctx.addIssue({ code: 'custom', path: ['notAssessableText'], message: 'Describe the reason the column could not be assessed' })
}

function checkFindings(value: CheckedFields, ctx: z.RefinementCtx) {
  requireHeight(value, ctx)
  requireColumnContext(value, ctx)
}

export const ExamFindingsSchema = z.object(ExamFindingsShape).superRefine(checkFindings)
export type ExamFindingsInput = z.input<typeof ExamFindingsSchema>
export type ExamFindings = z.infer<typeof ExamFindingsSchema>

export const PatientCodeSchema = z
  .string('Enter the patient code')
  .trim()
  .min(1, 'Enter the patient code')
  .max(40, 'A patient code is at most 40 characters')
  .regex(/^[A-Za-z0-9-]+$/, 'Use letters, digits and “-” only (never a name)')

const recordFields = {
  id: uuidField('The record id must be a UUID'),
  patientCode: PatientCodeSchema,
  teamId: idField('Choose a team'),
  examinedAt: clientTime('Enter the time of the exam'),
  notes: textField(2000, 'Notes are at most 2,000 characters'),
  /** The calibration round this exam is an entry of; null or absent for an ordinary exam. */
  roundId: idField('Choose a calibration round').nullish(),
}

const recordShape = { ...recordFields, notes: recordFields.notes.default(''), ...ExamFindingsShape }

const bandSchema = z.tuple([z.number().nullable(), z.number().nullable()]).nullable()

export const ObserverSourceSchema = z.enum(['default', 'local-pairs', 'local-rounds'])
export type ObserverSource = z.infer<typeof ObserverSourceSchema>

/** The band the examiner saw at review, sent with the save so the server can say when its own band differs. */
export const ReviewedBandSchema = z.object({
  bandCmH2O: bandSchema,
  observerSource: ObserverSourceSchema,
  settingsVersion: z.number().int().min(1).optional(),
})
export type ReviewedBand = z.infer<typeof ReviewedBandSchema>

/** What a client sends to create an exam. Unknown keys (status, version, estimate, examinerId) are dropped. */
export const ExamInputSchema = z.object({ ...recordShape, reviewed: ReviewedBandSchema.nullish() }).superRefine(checkFindings)
export type ExamInput = z.infer<typeof ExamInputSchema>
export type ExamInputRaw = z.input<typeof ExamInputSchema>

/** A change to an existing exam: any record field but the id, with the version it was based on. */
export const ExamPatchSchema = z
  .object({ ...recordFields, ...findingsFields })
  .omit({ id: true })
  .partial()
  .extend({ baseVersion: z.number('Send the version this change is based on').int().min(1), reviewed: ReviewedBandSchema.nullish() })
export type ExamPatch = z.infer<typeof ExamPatchSchema>

export const BoundSchema = z.enum(['point', 'lower', 'upper', 'none'])
export const CvpCategorySchema = z.enum(['low', 'normal', 'high'])
export const ConfidenceSchema = z.enum(['clear', 'indeterminate'])
export type Bound = z.infer<typeof BoundSchema>
export type CvpCategory = z.infer<typeof CvpCategorySchema>

/** Measurement cautions shown beside the number (never diagnoses); `arterial-evidence` always comes first. */
export const CautionCodeSchema = z.enum([
  'arterial-evidence',
  'few-venous-signs',
  'frame-disagreement',
  'convention-offset',
  'left-sided-vein',
  'outside-studied-range',
  'positive-pressure-ventilation',
  'svc-obstruction-suspected',
  'tense-ascites',
])
export const CautionSchema = z.object({ code: CautionCodeSchema, text: z.string() })
export type Caution = z.infer<typeof CautionSchema>

/** Prompts from Plumbline: patterns to consider, each with its differential; never diagnoses, never in the note unless added. */
export const PromptCodeSchema = z.enum([
  'cannon-a-waves',
  'prominent-a-waves',
  'absent-a-waves',
  'large-v-waves',
  'steep-y-descent',
  'blunted-y-descent',
  'kussmaul-sign',
  'abdominojugular-positive',
])
export const PromptSchema = z.object({
  code: PromptCodeSchema,
  finding: z.string(),
  differential: z.array(z.string()),
  /** A contradiction to query, e.g. absent a waves while the rhythm was recorded as sinus. */
  query: z.string().optional(),
})
export type Prompt = z.infer<typeof PromptSchema>

/** The local error term in force (or the default) and what it rests on. */
export const ObserverTermSchema = z.object({
  source: ObserverSourceSchema,
  /** `default`: σ_observer, combined with σ_read. Local: σ_exam = SD(d)/√2 or the pooled within-subject SD, replacing both. */
  sigmaCm: z.number().positive(),
  /** Pairs or complete subjects behind a local term; null for the default. */
  n: z.number().int().nullable(),
  /** 95% CI of a local σ (χ² on its degrees of freedom); null for the default. */
  ci: z.tuple([z.number(), z.number()]).nullable(),
})
export type ObserverTerm = z.infer<typeof ObserverTermSchema>

/** The fields both rules versions store alike: the numbers, the bound and the statements' common parts. */
const estimateCore = {
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
  confidence: ConfidenceSchema.nullable(),
  outsideStudiedRange: z.boolean(),
  venousSignCount: z.number().int(),
  caution: z.string(),
  /** The settings version whose thresholds and error terms the server used; absent before versioned settings (= version 1). */
  settingsVersion: z.number().int().min(1).optional(),
}

/** The estimate as the current rules compute it (version 2). */
export const EstimateSchema = z.object({
  ...estimateCore,
  rulesVersion: z.literal(2),
  /** The categories the 95% band (or the bound) reaches, low to high; empty without an estimate. */
  categories: z.array(CvpCategorySchema),
  /** 5 cm minus the CT-derived offset at this inclination: how far the classical convention sits from it. */
  conventionDiffCm: z.number().nullable(),
  observerSource: ObserverSourceSchema,
  observerSigmaCm: z.number().nullable(),
  observerN: z.number().int().nullable(),
  observerSigmaCi: z.tuple([z.number(), z.number()]).nullable(),
  arterialEvidence: z.boolean(),
  /** Venous signs present, counting the rhythm-expected absences as not against the vein. */
  venousSignCount: z.number().int(),
  cautions: z.array(CautionSchema),
  prompts: z.array(PromptSchema),
  /** Set by the server when the band the examiner reviewed differs from the one it stored (the error term changed in between). */
  reviewed: ReviewedBandSchema.nullish(),
})
export type EstimateV2 = z.infer<typeof EstimateSchema>

export const LegacyHintSchema = z.object({ code: z.string(), finding: z.string(), consider: z.string() })

/** An estimate stored under the first rules: one category from the point value, hints, a soft venous-sign warning. */
export const LegacyEstimateSchema = z.object({
  ...estimateCore,
  category: CvpCategorySchema.nullable(),
  observerSource: z.enum(['default', 'local']),
  mayBeArterial: z.boolean(),
  hints: z.array(LegacyHintSchema),
})
export type LegacyEstimate = z.infer<typeof LegacyEstimateSchema>

const LEGACY_PROMPTS = new Set<string>(PromptCodeSchema.options)

/** A first-rules estimate in today's shape, numbers untouched; `rulesVersion: 1` tells the reader how it was made. */
function fromLegacy(e: LegacyEstimate): Estimate {
  const leftVein = e.hints.find((h) => h.code === 'left-sided-vein')
  const cautions: Caution[] = []
  if (e.mayBeArterial) cautions.push({ code: 'few-venous-signs', text: 'Few venous signs were recorded: the pulsation may be arterial.' })
  if (leftVein) cautions.push({ code: 'left-sided-vein', text: `${leftVein.finding}: consider ${leftVein.consider}.` })
  const { category, mayBeArterial: _arterial, hints, observerSource, ...same } = e
  return {
    ...same,
    rulesVersion: 1,
    categories: category ? [category] : [],
    conventionDiffCm: null,
    observerSource: observerSource === 'local' ? 'local-pairs' : 'default',
    observerSigmaCm: null,
    observerN: null,
    observerSigmaCi: null,
    arterialEvidence: false,
    cautions,
    prompts: hints
      .filter((h) => LEGACY_PROMPTS.has(h.code))
      .map((h) => ({ code: PromptCodeSchema.parse(h.code), finding: h.finding, differential: [h.consider] })),
  }
}

/** An estimate as read back: the current form, or a stored first-rules one shown as it was saved. */
export type Estimate = Omit<EstimateV2, 'rulesVersion'> & { rulesVersion: 1 | 2 }

/** Reads a stored or received estimate of either rules version. */
export const StoredEstimateSchema = z.union([
  EstimateSchema,
  // A first-rules estimate the server already presents in today's shape.
  EstimateSchema.extend({ rulesVersion: z.literal(1) }),
  LegacyEstimateSchema.transform(fromLegacy),
])

export const ExamSchema = z.object({
  ...recordShape,
  // As stored: a record saved before a field's rules were tightened still reads back.
  teamId: z.string(),
  examinedAt: z.string(),
  notes: z.string().default(''),
  roundId: z.string().nullish(),
  notAssessableText: z.string().nullish(),
  id: z.string(),
  examinerId: z.string(),
  examinerName: z.string(),
  teamName: z.string(),
  status: ExamStatusSchema,
  version: z.number().int(),
  estimate: StoredEstimateSchema,
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
  teamId: idField('Choose a team').optional(),
  examinerId: idField('Choose an examiner').optional(),
  patientCode: lineField(40).optional(),
  from: clientTime('Use an ISO 8601 date-time').optional(),
  to: clientTime('Use an ISO 8601 date-time').optional(),
  sort: ExamSortSchema.default('examinedAt'),
  order: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  /** The `nextCursor` of the page before, for the same filters and sort: the page after it, however deep. */
  cursor: z.string().max(400).optional(),
})
export type ExamListQuery = z.infer<typeof ExamListQuerySchema>

/** How many matching exams the log counts at most: past it, `total` is this cap and `totalCapped` is true ("10,000+"). */
export const EXAM_COUNT_CAP = 10_000

export const ExamListSchema = z.object({
  exams: z.array(ExamSchema),
  /** Matching exams, counted up to `EXAM_COUNT_CAP`. */
  total: z.number().int(),
  /** More exams match than `total` says. */
  totalCapped: z.boolean().default(false),
  page: z.number().int(),
  pageSize: z.number().int(),
  /** Opaque: send it as `cursor` for the next page; null on the last page. */
  nextCursor: z.string().nullable().default(null),
})
export type ExamList = z.infer<typeof ExamListSchema>

/** A 409 on a stale or locked exam carries the server's copy. */
export const ExamConflictSchema = ApiErrorSchema.extend({ exam: ExamSchema })
export type ExamConflict = z.infer<typeof ExamConflictSchema>

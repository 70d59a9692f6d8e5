import { z } from 'zod'
import { LANDIS_KOCH_LABELS } from '../stats/landis-koch.ts'
import { CvpCategorySchema, VeinSchema } from './exam.ts'
import { clientTime, idField } from './fields.ts'

const isoTime = clientTime('Use an ISO 8601 date-time')
const interval = z.tuple([z.number(), z.number()])

/**
 * Inclination bands of the agreement filter, on half-open intervals of the pair's mean inclination (the mean of its
 * two exams' trunk inclinations): `0-29` is [0°, 30°), `30-59` is [30°, 60°), `60-90` is [60°, 90°]. The mean puts
 * every pair in exactly one band, so the bands split the pairs without loss; the two exams of a pair are usually
 * taken in the same posture.
 */
export const INCLINATION_BANDS = ['0-29', '30-59', '60-90'] as const
export const InclinationBandSchema = z.enum(INCLINATION_BANDS)
export type InclinationBand = z.infer<typeof InclinationBandSchema>

/** The band of a mean inclination in degrees (see {@link INCLINATION_BANDS}). */
export function inclinationBandOf(meanDeg: number): InclinationBand {
  return meanDeg < 30 ? '0-29' : meanDeg < 60 ? '30-59' : '60-90'
}

/**
 * The vein filter: one of the exam's veins, or `internal` / `external` for either side. A pair matches only when
 * both of its exams were read on a matching vein, so mixed-vein pairs appear under no vein filter.
 */
export const VeinFilterSchema = z.enum([...VeinSchema.options, 'internal', 'external'])
export type VeinFilter = z.infer<typeof VeinFilterSchema>

/** Whether an exam's vein matches the vein filter. */
export function veinMatches(filter: VeinFilter, vein: string): boolean {
  return filter === 'internal' || filter === 'external' ? vein.endsWith(`-${filter}`) : vein === filter
}

/** Filters of the agreement views: the time of a pair is the time of its earlier exam. */
export const AgreementQuerySchema = z.object({
  from: isoTime.optional(),
  to: isoTime.optional(),
  teamId: idField('Choose a team').optional(),
  examinerId: idField('Choose an examiner').optional(),
  inclinationBand: InclinationBandSchema.optional(),
  vein: VeinFilterSchema.optional(),
})
export type AgreementQuery = z.infer<typeof AgreementQuerySchema>

export const AgreementPairsQuerySchema = AgreementQuerySchema.extend({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(1000).default(50),
  /** Set by a download: the first page writes the export to the audit trail. */
  export: z.literal('csv').optional(),
})
export type AgreementPairsQuery = z.infer<typeof AgreementPairsQuerySchema>

export const LandisKochLabelSchema = z.enum(LANDIS_KOCH_LABELS)

/** Why a statistic is not shown, e.g. too few pairs or no spread: never a NaN. */
export const UnavailableSchema = z.object({ unavailable: z.string() })
const orUnavailable = <T extends z.ZodType>(schema: T) => z.union([schema, UnavailableSchema])

export const AgreementRoleSchema = z.enum(['resident', 'attending'])

/**
 * How a pair's difference is taken: the resident's reading minus the attending's when exactly one examiner is an
 * attending, otherwise the earlier reading minus the later one.
 */
export const PairOrderSchema = z.enum(['resident-minus-attending', 'earlier-minus-later'])
export type PairOrder = z.infer<typeof PairOrderSchema>

export const BlandAltmanSummarySchema = z.object({
  bias: z.number(),
  sd: z.number(),
  loa: interval,
  biasCi: interval,
  loaCi: z.object({ lower: interval, upper: interval }),
})

/** One examiner's readings against their partners' (own − partner's), whichever side of the pair they were on. */
export const ExaminerAgreementSchema = z.object({
  examinerId: z.string(),
  name: z.string(),
  role: AgreementRoleSchema,
  n: z.number().int(),
  bias: z.number(),
  /** Null below 2 pairs. */
  sd: z.number().nullable(),
  loa: interval.nullable(),
})
export type ExaminerAgreement = z.infer<typeof ExaminerAgreementSchema>

/** Pairs a statistic did not count, and why (`n` 0 when it counted every pair). */
export const LeftOutSchema = z.object({ n: z.number().int(), reason: z.string() })

/**
 * Agreement on h above the sternal angle and on the derived categories. `n` counts every matching pair, bounds
 * included: an exam whose column top was above the neck (a lower bound, with the height of the highest visible point
 * of the neck) or not filled even lying flat (an upper bound, no height) pairs like a seen one.
 */
export const AgreementSummarySchema = z.object({
  n: z.number().int(),
  /** Over the pairs with a measured height on both sides (both column tops seen). */
  blandAltman: orUnavailable(BlandAltmanSummarySchema),
  /** ICC(1,1), one-way random effects (Shrout & Fleiss 1979, case 1), over the same pairs as `blandAltman`. */
  icc: orUnavailable(z.object({ value: z.number(), ci: interval })),
  /**
   * Cohen's kappa, elevated when h > 3 cm (McGee 1998, Am Heart J 136:10–18). Bounds count: above the neck with h > 3
   * is elevated, not filled is not elevated; above the neck with h ≤ 3 cannot say and its pair is left out.
   */
  kappaElevated: orUnavailable(z.object({ value: z.number(), label: LandisKochLabelSchema })),
  /**
   * Weighted over low/normal/high (Cook 1990: low < 5, normal 5–10, high > 10 cmH₂O); the label is Landis & Koch's for
   * the linear kappa. A point counts in its estimate's category. A bound counts only when its own limit decides one
   * category: above the neck (CVP ≥ h + offset) with the limit above 10 is high, not filled (CVP ≤ the offset) with
   * the limit below 5 is low; any other bound reaches two or more categories and its pair is left out.
   */
  kappaCategory: orUnavailable(z.object({ linear: z.number(), quadratic: z.number(), label: LandisKochLabelSchema })),
  /** Over the same pairs as `blandAltman`. */
  byExaminer: z.array(ExaminerAgreementSchema),
  /**
   * How many of the `n` pairs each statistic left out, and why: `heights` for Bland–Altman, the ICC, `byExaminer` and
   * the trend (a bound on either side), `kappaElevated` and `kappaCategory` for a bound that does not decide. Always
   * sent by servers that pair bounds; optional so that older responses still read.
   */
  leftOut: z.object({ heights: LeftOutSchema, kappaElevated: LeftOutSchema, kappaCategory: LeftOutSchema }).optional(),
})
export type AgreementSummary = z.infer<typeof AgreementSummarySchema>

export const PairReadingSchema = z.object({
  examId: z.string(),
  examinerId: z.string(),
  examinerName: z.string(),
  role: AgreementRoleSchema,
  teamId: z.string(),
  examinedAt: z.string(),
  heightCm: z.number(),
  inclinationDeg: z.number(),
  vein: VeinSchema,
  category: CvpCategorySchema,
  elevated: z.boolean(),
})
export type PairReading = z.infer<typeof PairReadingSchema>

/**
 * A pair as the viewer may see it: the patient code is masked unless the viewer may read it on the exams. Lists and
 * downloads hold the pairs with a measured height on both sides (both column tops seen), those the plots draw.
 */
export const AgreementPairSchema = z.object({
  patientCode: z.string(),
  order: PairOrderSchema,
  /** first.heightCm − second.heightCm. */
  differenceCm: z.number(),
  meanCm: z.number(),
  minutesApart: z.number(),
  first: PairReadingSchema,
  second: PairReadingSchema,
})
export type AgreementPair = z.infer<typeof AgreementPairSchema>

export const AgreementPairListSchema = z.object({
  pairs: z.array(AgreementPairSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
})
export type AgreementPairList = z.infer<typeof AgreementPairListSchema>

/**
 * One calendar month (UTC) of the trend: the Bland–Altman bias, SD and limits of the pairs whose earlier exam falls in
 * it, differences taken as in the summary, over the pairs with a measured height on both sides. `bias` is null without
 * pairs; `sd` and `loa` are null below 2 pairs.
 */
export const MonthAgreementSchema = z.object({
  /** `YYYY-MM`, UTC. */
  month: z.string().regex(/^\d{4}-\d{2}$/),
  n: z.number().int(),
  bias: z.number().nullable(),
  sd: z.number().nullable(),
  loa: interval.nullable(),
})
export type MonthAgreement = z.infer<typeof MonthAgreementSchema>

/** Every month from the first pair's to the last pair's, months without pairs included (n 0), oldest first. */
export const AgreementTrendSchema = z.object({ months: z.array(MonthAgreementSchema) })
export type AgreementTrend = z.infer<typeof AgreementTrendSchema>

import { z } from 'zod'
import { BoundSchema } from './exam.ts'

/**
 * A measured pressure recorded beside an exam: a central-line CVP, a right-heart-catheter right atrial pressure, or
 * the echocardiographic right atrial pressure estimate from IVC size and collapse (Rudski et al. 2010, J Am Soc
 * Echocardiogr 23:685–713: 3, 8 or 15 mmHg).
 */
export const ReferenceKindSchema = z.enum(['central-line', 'catheter-ra', 'echo-ra'])
export type ReferenceKind = z.infer<typeof ReferenceKindSchema>

export const ReferenceUnitSchema = z.enum(['mmHg', 'cmH2O'])
export type ReferenceUnit = z.infer<typeof ReferenceUnitSchema>

/** The three right atrial pressures of the echocardiographic estimate (Rudski et al. 2010), in mmHg. */
export const ECHO_RA_MMHG = [3, 8, 15] as const

const isoTime = z.iso.datetime({ offset: true, message: 'Use an ISO 8601 date-time' })

/** Product limits for a measured venous pressure: wide enough for any bedside value, narrow enough to catch typing errors. */
export const REFERENCE_LIMITS = { mmHg: { min: -10, max: 40 }, cmH2O: { min: -14, max: 55 } } as const

interface ReferenceFields {
  kind: ReferenceKind
  value: number
  unit: ReferenceUnit
}

function checkValue(value: ReferenceFields, ctx: z.RefinementCtx) {
  if (value.kind === 'echo-ra') {
    if (value.unit !== 'mmHg') ctx.addIssue({ code: 'custom', path: ['unit'], message: 'An echocardiographic estimate is given in mmHg' })
    else if (!(ECHO_RA_MMHG as readonly number[]).includes(value.value))
      ctx.addIssue({ code: 'custom', path: ['value'], message: 'An echocardiographic estimate is 3, 8 or 15 mmHg (IVC size and collapse)' })
    return
  }
  const { min, max } = REFERENCE_LIMITS[value.unit]
  if (value.value < min || value.value > max)
    ctx.addIssue({ code: 'custom', path: ['value'], message: `A measured pressure is between ${min} and ${max} ${value.unit === 'cmH2O' ? 'cmH₂O' : 'mmHg'}` })
}

/** `POST /api/exams/:id/references`. The server refuses a `measuredAt` in the future (same tolerance as exams). */
export const ReferenceInputSchema = z
  .object({
    kind: ReferenceKindSchema,
    value: z.number('Enter the measured pressure').finite('Enter the measured pressure'),
    unit: ReferenceUnitSchema,
    measuredAt: isoTime,
  })
  .superRefine(checkValue)
export type ReferenceInput = z.infer<typeof ReferenceInputSchema>

/** A stored reference; not part of the exam's signed content. */
export const ReferenceSchema = z.object({
  id: z.string(),
  examId: z.string(),
  kind: ReferenceKindSchema,
  value: z.number(),
  unit: ReferenceUnitSchema,
  /** The value in cmH₂O (NIST SP 811 factors), the unit accuracy pairs are compared in. */
  valueCmH2O: z.number(),
  measuredAt: z.string(),
  addedById: z.string(),
  addedByName: z.string(),
  addedAt: z.string(),
  /** Within the reference window of its exam (a setting, 60 minutes by default): it forms an accuracy pair. */
  paired: z.boolean(),
})
export type Reference = z.infer<typeof ReferenceSchema>

export const ReferenceListSchema = z.object({ references: z.array(ReferenceSchema) })
export type ReferenceList = z.infer<typeof ReferenceListSchema>

/** `GET /api/agreement/accuracy`: the time of a pair is the exam's time. */
export const AccuracyQuerySchema = z.object({
  from: isoTime.optional(),
  to: isoTime.optional(),
  teamId: z.string().min(1).optional(),
  kind: ReferenceKindSchema.optional(),
})
export type AccuracyQuery = z.infer<typeof AccuracyQuerySchema>

const interval = z.tuple([z.number(), z.number()])

/** One accuracy pair as the plots draw it: estimate and reference in cmH₂O, the stored band or bound. */
export const AccuracyPointSchema = z.object({
  examId: z.string(),
  kind: ReferenceKindSchema,
  estimateCmH2O: z.number(),
  referenceCmH2O: z.number(),
  bound: BoundSchema,
  /** The stored 95% band; a bound's open side is null (a lower bound [low, null], an upper bound [null, high]). */
  band: z.tuple([z.number().nullable(), z.number().nullable()]),
  inside: z.boolean(),
})
export type AccuracyPoint = z.infer<typeof AccuracyPointSchema>

/**
 * Accuracy of the estimate against measured pressures: difference = estimate − reference (cmH₂O), Bland–Altman bias,
 * SD and 95% limits (Bland & Altman 1986, Lancet i:307–310); coverage = references inside the exam's stored 95% band
 * (a bound counts when the reference lies on its open side), with the Wilson score interval (Wilson 1927, JASA
 * 22:209–212; Newcombe 1998, Stat Med 17:857–872, method 3). `n` counts the pairs with a point estimate (a bound has
 * no difference to take); `coverage.n` counts every pair. Bias, sd and loa are null below 2 point pairs.
 */
export const AccuracySummarySchema = z.object({
  n: z.number().int(),
  bias: z.number().nullable(),
  sd: z.number().nullable(),
  loa: interval.nullable(),
  coverage: z.object({ inside: z.number().int(), n: z.number().int(), share: z.number().nullable(), ci: interval.nullable() }),
  /** The most recent pairs for the plots, at most `ACCURACY_POINTS_MAX`; the statistics use all `n`. */
  points: z.array(AccuracyPointSchema),
  caution: z.string(),
})
export type AccuracySummary = z.infer<typeof AccuracySummarySchema>

export const ACCURACY_POINTS_MAX = 2000

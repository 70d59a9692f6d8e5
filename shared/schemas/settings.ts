import { z } from 'zod'
import { ObserverTermSchema, OffsetModelSchema } from './exam.ts'

/** A number in a unit between bounds, with messages naming the setting; `above` excludes the lower bound. */
function measure(label: string, unit: string, min: number, max: number, above = false) {
  const number = z.number(`Enter ${label.replace(/^The/, 'the')} in ${unit}`)
  const floor = above ? number.gt(min, `${label} must be above ${min} ${unit}`) : number.min(min, `${label} is at least ${min} ${unit}`)
  return floor.max(max, `${label} is at most ${max} ${unit}`)
}

/** The estimate's thresholds and error terms, each required: an admin's save states every value. */
const estimateFields = {
  elevatedAboveCm: measure('The elevated-JVP threshold', 'cm', 0, 10),
  lowBelowCmH2O: measure('The low-CVP threshold', 'cmH₂O', 0, 20),
  highAboveCmH2O: measure('The high-CVP threshold', 'cmH₂O', 0, 30),
  sigmaReadRulerCm: measure('The ruler reading error', 'cm', 0, 5, true),
  sigmaReadVisualCm: measure('The visual reading error', 'cm', 0, 5, true),
  sigmaOffsetCm: measure('The offset error', 'cm', 0, 5, true),
  sigmaOffsetOutsideRangeCm: measure('The offset error above 60°', 'cm', 0, 5, true),
  sigmaObserverCm: measure('The default observer error', 'cm', 0, 10, true),
  minVenousSigns: z.number('Enter a count of venous signs').int('Enter a whole number of signs').min(0, 'At least 0 signs').max(6, 'At most 6 signs (there are six)'),
}

const f = estimateFields

/** Thresholds and error terms of the estimate; a missing value takes its default, whose source is beside it. */
export const EstimateSettingsSchema = z.object({
  elevatedAboveCm: f.elevatedAboveCm.default(3), // McGee 1998, Am Heart J 136:10–18
  lowBelowCmH2O: f.lowBelowCmH2O.default(5), // categories used by Cook 1990
  highAboveCmH2O: f.highAboveCmH2O.default(10), // categories used by Cook 1990
  sigmaReadRulerCm: f.sigmaReadRulerCm.default(0.5), // product default, no published source
  sigmaReadVisualCm: f.sigmaReadVisualCm.default(1.5), // product default, no published source
  sigmaOffsetCm: f.sigmaOffsetCm.default(1.0), // Seth 2002 supine IQR 4.7–6.1 cm ÷ 1.349
  sigmaOffsetOutsideRangeCm: f.sigmaOffsetOutsideRangeCm.default(2.0), // product default beyond Seth's studied range
  sigmaObserverCm: f.sigmaObserverCm.default(2.0), // product default: no single published ± value
  minVenousSigns: f.minVenousSigns.default(3), // Cook & Simel 1996 (JAMA 275:630–634) signs; product cut-off
})
export type EstimateSettings = z.infer<typeof EstimateSettingsSchema>

export const DEFAULT_ESTIMATE_SETTINGS: EstimateSettings = EstimateSettingsSchema.parse({})

/** Bounds of the pairing window for paired exams: a quarter of an hour to a day. */
export const PAIR_WINDOW_MINUTES = { min: 15, max: 1440, default: 120 } as const

/** Bounds of the reference window: how far a measured pressure may be from its exam to form an accuracy pair. */
export const REFERENCE_WINDOW_MINUTES = { min: 5, max: 240, default: 60 } as const

const appFields = {
  estimate: z.object(estimateFields, 'Send the estimate settings'),
  pairWindowMinutes: z
    .number('Enter the pairing window in minutes')
    .int('Enter a whole number of minutes')
    .min(PAIR_WINDOW_MINUTES.min, `The pairing window is at least ${PAIR_WINDOW_MINUTES.min} minutes`)
    .max(PAIR_WINDOW_MINUTES.max, `The pairing window is at most ${PAIR_WINDOW_MINUTES.max} minutes (one day)`),
  referenceWindowMinutes: z
    .number('Enter the reference window in minutes')
    .int('Enter a whole number of minutes')
    .min(REFERENCE_WINDOW_MINUTES.min, `The reference window is at least ${REFERENCE_WINDOW_MINUTES.min} minutes`)
    .max(REFERENCE_WINDOW_MINUTES.max, `The reference window is at most ${REFERENCE_WINDOW_MINUTES.max} minutes`),
  defaultOffsetModel: OffsetModelSchema,
  photosAllowed: z.boolean('Say whether photos are allowed'),
}

type AppValues = { [K in keyof typeof appFields]: z.infer<(typeof appFields)[K]> }

/** Checks between fields, each reported on the field to correct (keyed like `estimate.highAboveCmH2O`). */
function crossChecks(value: AppValues, ctx: z.RefinementCtx) {
  const e = value.estimate
  if (e.lowBelowCmH2O >= e.highAboveCmH2O) {
    ctx.addIssue({ code: 'custom', path: ['estimate', 'lowBelowCmH2O'], message: `The low-CVP threshold must be below the high-CVP threshold (${e.highAboveCmH2O} cmH₂O)` })
    ctx.addIssue({ code: 'custom', path: ['estimate', 'highAboveCmH2O'], message: `The high-CVP threshold must be above the low-CVP threshold (${e.lowBelowCmH2O} cmH₂O)` })
  }
  if (e.sigmaReadVisualCm < e.sigmaReadRulerCm)
    ctx.addIssue({ code: 'custom', path: ['estimate', 'sigmaReadVisualCm'], message: `A visual reading cannot be more precise than a ruler reading (${e.sigmaReadRulerCm} cm)` })
  if (e.sigmaOffsetOutsideRangeCm < e.sigmaOffsetCm)
    ctx.addIssue({ code: 'custom', path: ['estimate', 'sigmaOffsetOutsideRangeCm'], message: `The offset error above 60° cannot be below the offset error within the studied range (${e.sigmaOffsetCm} cm)` })
}

/** The settings an admin manages: the estimate's thresholds, the pairing window, the default offset model, photos. */
export const AppSettingsSchema = z.object(appFields).superRefine(crossChecks)
export type AppSettings = z.infer<typeof AppSettingsSchema>

/**
 * Photos default to off: a photo of the neck can identify a patient, so a deployment turns them on only once its
 * consent and storage rules are settled (data minimisation: patient data is kept to the minimum).
 */
export const DEFAULT_APP_SETTINGS: AppSettings = {
  estimate: DEFAULT_ESTIMATE_SETTINGS,
  pairWindowMinutes: PAIR_WINDOW_MINUTES.default,
  // Product default: a measured pressure within an hour of the exam is taken as contemporaneous (no published source).
  referenceWindowMinutes: REFERENCE_WINDOW_MINUTES.default,
  defaultOffsetModel: 'incline-adjusted',
  photosAllowed: false,
}

/** An admin's save: every setting, and the version the change was based on (an older one answers 409). */
export const AppSettingsUpdateSchema = z
  .object({ ...appFields, baseVersion: z.number('Send the version this change is based on').int().min(1) })
  .superRefine(crossChecks)
export type AppSettingsUpdate = z.infer<typeof AppSettingsUpdateSchema>

/** Stored values as the current schema reads them: settings added since they were written take their defaults. */
export function withDefaults(stored: unknown): AppSettings {
  const raw = (stored && typeof stored === 'object' ? stored : {}) as Partial<Record<string, unknown>>
  const estimate = raw.estimate && typeof raw.estimate === 'object' ? raw.estimate : {}
  return AppSettingsSchema.parse({ ...DEFAULT_APP_SETTINGS, ...raw, estimate: { ...DEFAULT_ESTIMATE_SETTINGS, ...estimate } })
}

/** One version of the settings as any signed-in user reads it. */
export const SettingsVersionSchema = z.object({
  version: z.number().int().min(1),
  values: AppSettingsSchema,
  changedAt: z.string(),
})
export type SettingsVersion = z.infer<typeof SettingsVersionSchema>

/**
 * The settings in force with the error term the server will use (`GET /api/settings`): the device computes the band
 * the examiner reviews with the same term, so the band shown at the bedside is the band that is saved.
 */
export const SettingsInForceSchema = SettingsVersionSchema.extend({ observerTerm: ObserverTermSchema })
export type SettingsInForce = z.infer<typeof SettingsInForceSchema>

export const SettingChangeSchema = z.object({ from: z.unknown(), to: z.unknown() })

/** A version in the admin's history: who saved it, when, and what it changed against the version before. */
export const SettingsHistoryEntrySchema = SettingsVersionSchema.extend({
  changedBy: z.object({ id: z.string(), displayName: z.string() }).nullable(),
  changes: z.record(z.string(), SettingChangeSchema),
})
export type SettingsHistoryEntry = z.infer<typeof SettingsHistoryEntrySchema>

export const SettingsHistorySchema = z.object({ versions: z.array(SettingsHistoryEntrySchema) })
export type SettingsHistory = z.infer<typeof SettingsHistorySchema>

function flatten(settings: AppSettings): Map<string, unknown> {
  const { estimate, ...rest } = settings
  return new Map<string, unknown>([...Object.entries(estimate).map(([key, v]) => [`estimate.${key}`, v] as const), ...Object.entries(rest)])
}

/** Field-by-field differences, keyed by path (`estimate.lowBelowCmH2O`), of the settings that changed; `before` null for the first version. */
export function settingsChanges(before: AppSettings | null, after: AppSettings): Record<string, { from: unknown; to: unknown }> {
  const from = before ? flatten(before) : new Map<string, unknown>()
  const changes: Record<string, { from: unknown; to: unknown }> = {}
  for (const [key, to] of flatten(after)) if (from.get(key) !== to) changes[key] = { from: from.get(key) ?? null, to }
  return changes
}

/**
 * The settings version an estimate was computed with. Estimates stored before versioned settings carry none: they
 * were computed with the defaults, which version 1 holds.
 */
export function settingsVersionOf(estimate: { settingsVersion?: number }): number {
  return estimate.settingsVersion ?? 1
}

import { z } from 'zod'

/** Thresholds and error terms of the estimate (§4); every default is cited in the engine. */
export const EstimateSettingsSchema = z.object({
  elevatedAboveCm: z.number().min(0).max(10).default(3),
  lowBelowCmH2O: z.number().min(0).max(20).default(5),
  highAboveCmH2O: z.number().min(0).max(30).default(10),
  sigmaReadRulerCm: z.number().positive().max(5).default(0.5),
  sigmaReadVisualCm: z.number().positive().max(5).default(1.5),
  sigmaOffsetCm: z.number().positive().max(5).default(1.0),
  sigmaOffsetOutsideRangeCm: z.number().positive().max(5).default(2.0),
  sigmaObserverCm: z.number().positive().max(10).default(2.0),
  minVenousSigns: z.number().int().min(0).max(6).default(3),
})
export type EstimateSettings = z.infer<typeof EstimateSettingsSchema>

export const DEFAULT_ESTIMATE_SETTINGS: EstimateSettings = EstimateSettingsSchema.parse({})

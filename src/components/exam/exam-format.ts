import type { Bound, CvpCategory, Estimate, OffsetModel } from '#shared/schemas/exam'
import { DEFAULT_ESTIMATE_SETTINGS, type EstimateSettings } from '#shared/schemas/settings'

type Band = [number | null, number | null] | null

/** One decimal, with a true minus sign. */
export function formatNumber(value: number, digits = 1): string {
  return value.toFixed(digits).replace('-', '−')
}

/** A 95% band in words: both ends, or the one end a bound leaves open. */
export function formatBand(band: Band, unit: string): string {
  if (!band) return '—'
  const [low, high] = band
  if (low !== null && high !== null) return `${formatNumber(low)}–${formatNumber(high)} ${unit}`
  if (low !== null) return `${formatNumber(low)} ${unit} or more`
  if (high !== null) return `up to ${formatNumber(high)} ${unit}`
  return '—'
}

export const BOUND_WORDING: Record<Bound, { prefix: string; explanation: string }> = {
  point: { prefix: '', explanation: 'Column top seen: a point estimate.' },
  lower: { prefix: 'At least', explanation: 'The column top was above the visible neck, so the CVP is at least this.' },
  upper: { prefix: 'At most', explanation: 'No column was seen even lying flat, so the CVP is at most the offset at this angle.' },
  none: { prefix: 'Not estimable', explanation: 'The column top could not be assessed, so there is no estimate.' },
}

export const CATEGORY_LABELS: Record<CvpCategory, string> = { low: 'Low CVP (< 5)', normal: 'Normal CVP (5–10)', high: 'High CVP (> 10)' }

/**
 * A category with the limits of the settings it was judged by; `null` when those settings are not known on this
 * device, and then without limits (the stored category stands, but no other version's limits may be put beside it).
 */
export function categoryLabel(category: CvpCategory, settings: EstimateSettings | null = DEFAULT_ESTIMATE_SETTINGS): string {
  if (!settings) return { low: 'Low CVP', normal: 'Normal CVP', high: 'High CVP' }[category]
  const [low, high] = [formatLimit(settings.lowBelowCmH2O), formatLimit(settings.highAboveCmH2O)]
  return { low: `Low CVP (< ${low})`, normal: `Normal CVP (${low}–${high})`, high: `High CVP (> ${high})` }[category]
}

/** Short names of the estimate settings, as a note on a past estimate lists those changed since. */
const ESTIMATE_SETTING_NAMES: Record<keyof EstimateSettings, string> = {
  elevatedAboveCm: 'elevated-JVP threshold',
  lowBelowCmH2O: 'low-CVP threshold',
  highAboveCmH2O: 'high-CVP threshold',
  minVenousSigns: 'venous-sign count',
  sigmaReadRulerCm: 'error band',
  sigmaReadVisualCm: 'error band',
  sigmaOffsetCm: 'error band',
  sigmaOffsetOutsideRangeCm: 'error band',
  sigmaObserverCm: 'error band',
}

/** The names of the estimate settings that differ between two versions, each once, in a fixed order; empty when none. */
export function estimateSettingsChanged(then: EstimateSettings, now: EstimateSettings): string[] {
  const keys = Object.keys(ESTIMATE_SETTING_NAMES) as (keyof EstimateSettings)[]
  return [...new Set(keys.filter((key) => then[key] !== now[key]).map((key) => ESTIMATE_SETTING_NAMES[key]))]
}

/** A list in words: "a", "a and b", "a, b and c". */
export function listInWords(items: string[]): string {
  return items.length < 2 ? (items[0] ?? '') : `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`
}

/** A threshold as written in labels: whole numbers without a decimal. */
export function formatLimit(value: number): string {
  return Number.isInteger(value) ? String(value) : formatNumber(value)
}

export const MODEL_LABELS: Record<OffsetModel, string> = {
  'incline-adjusted': 'Incline-adjusted offset (Seth 2002)',
  'fixed-5cm': 'Fixed 5 cm offset (classical rule)',
}

export function otherModel(model: OffsetModel): OffsetModel {
  return model === 'incline-adjusted' ? 'fixed-5cm' : 'incline-adjusted'
}

/** Whether the estimate carries a number at all. */
export function hasValue(estimate: Estimate): estimate is Estimate & { cvpCmH2O: number; cvpMmHg: number } {
  return estimate.cvpCmH2O !== null && estimate.cvpMmHg !== null
}

import type { Bound, Caution, ContextFlag, CvpCategory, Estimate, ObserverSource, ObserverTerm, OffsetModel } from '#shared/schemas/exam'
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
  lower: {
    prefix: 'At least',
    explanation: 'The column top was above the visible neck, so the CVP is at least this; the band gives its one-sided 95% lower limit.',
  },
  upper: {
    prefix: 'At most',
    explanation: 'No column was seen even lying flat, so the CVP is at most the offset at this angle; the band gives its one-sided 95% upper limit.',
  },
  none: { prefix: 'Not estimable', explanation: 'The column top could not be assessed, so there is no estimate.' },
}

/**
 * The limits of the categories an estimate reaches, in the settings it was judged by ("normal 5–10, high > 10
 * cmH₂O"); null when those settings are not known on this device (no other version's limits may stand beside it).
 */
export function categoryLimits(categories: readonly CvpCategory[], settings: EstimateSettings | null = DEFAULT_ESTIMATE_SETTINGS): string | null {
  if (!settings || !categories.length) return null
  const [low, high] = [formatLimit(settings.lowBelowCmH2O), formatLimit(settings.highAboveCmH2O)]
  const limits = { low: `low < ${low}`, normal: `normal ${low}–${high}`, high: `high > ${high}` }
  return `${categories.map((category) => limits[category]).join(', ')} cmH₂O`
}

export const CONTEXT_LABELS: Record<ContextFlag, string> = {
  'positive-pressure-ventilation': 'Positive-pressure ventilation',
  'svc-obstruction-suspected': 'Superior vena cava obstruction suspected',
  'tense-ascites': 'Tense ascites',
}

export const OBSERVER_SOURCE_LABELS: Record<ObserverSource, string> = {
  default: 'the default error terms (product defaults)',
  'local-pairs': 'the local error term from paired exams',
  'local-rounds': 'the local error term from calibration rounds',
}

/** The error term an estimate was computed with, when it stored one (first-rules estimates did not). */
export function observerTermOf(estimate: Estimate): ObserverTerm | undefined {
  if (estimate.observerSigmaCm === null) return undefined
  return { source: estimate.observerSource, sigmaCm: estimate.observerSigmaCm, n: estimate.observerN, ci: estimate.observerSigmaCi }
}

/** Where each measurement caution is shown: first of all, beside the number, beside the statements, or with the rest. */
export function cautionsAt(estimate: Estimate, place: 'first' | 'number' | 'statements' | 'other'): Caution[] {
  return estimate.cautions.filter((caution) => CAUTION_PLACE[caution.code] === place)
}

const CAUTION_PLACE: Record<Caution['code'], 'first' | 'number' | 'statements' | 'other'> = {
  'arterial-evidence': 'first',
  'left-sided-vein': 'number',
  'outside-studied-range': 'number',
  'convention-offset': 'number',
  'frame-disagreement': 'statements',
  'few-venous-signs': 'other',
  'positive-pressure-ventilation': 'other',
  'svc-obstruction-suspected': 'other',
  'tense-ascites': 'other',
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

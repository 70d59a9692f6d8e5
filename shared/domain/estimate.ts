import type { Bound, Estimate, ExamFindings } from '../schemas/exam.ts'
import { DEFAULT_ESTIMATE_SETTINGS, type EstimateSettings } from '../schemas/settings.ts'
import { CAUTION_TEXT, bandIsClear, categoryOf, hintsFor } from './interpretation.ts'
import { FIXED_OFFSET_CM, inclineAdjustedOffset, offsetFor } from './offset.ts'
import { cmH2OToMmHg, withoutFloatNoise } from './units.ts'

const Z_95 = 1.96

export interface ObserverTerm {
  sigmaCm: number
  source: 'default' | 'local'
}

export interface EstimateOptions {
  settings?: EstimateSettings
  /** Local inter-observer spread once enough pairs exist (§6); the settings' default otherwise. */
  observer?: ObserverTerm
}

/** Vertical height of the column top above the sternal angle, from either measuring method. */
export function verticalHeightCm(findings: ExamFindings): number | null {
  if (findings.heightMethod === 'along-neck') {
    if (findings.alongNeckCm === null || findings.alongNeckCm === undefined) return null
    return withoutFloatNoise(findings.alongNeckCm * Math.sin((findings.inclinationDeg * Math.PI) / 180))
  }
  return findings.heightCm ?? null
}

/** σ of the offset: the fixed rule adds its bias against the incline-adjusted medians. */
export function offsetSigmaCm(findings: ExamFindings, settings: EstimateSettings): number {
  const adjusted = inclineAdjustedOffset(findings.inclinationDeg)
  if (findings.offsetModel === 'fixed-5cm') return Math.hypot(settings.sigmaOffsetCm, adjusted.offsetCm - FIXED_OFFSET_CM)
  return adjusted.outsideStudiedRange ? settings.sigmaOffsetOutsideRangeCm : settings.sigmaOffsetCm
}

function boundOf(findings: ExamFindings, heightCm: number | null): Bound {
  if (findings.columnTop === 'not-assessable') return 'none'
  if (findings.columnTop === 'not-filled') return 'upper'
  if (heightCm === null) return 'none'
  return findings.columnTop === 'above-neck' ? 'lower' : 'point'
}

function toMmHg(band: [number | null, number | null]): [number | null, number | null] {
  return [band[0] === null ? null : cmH2OToMmHg(band[0]), band[1] === null ? null : cmH2OToMmHg(band[1])]
}

/** The estimated CVP with its 95% band and interpretation, by the rules of §4. Pure; used offline and on the server. */
export function computeEstimate(findings: ExamFindings, options: EstimateOptions = {}): Estimate {
  const settings = options.settings ?? DEFAULT_ESTIMATE_SETTINGS
  const observer = options.observer ?? { sigmaCm: settings.sigmaObserverCm, source: 'default' }
  const { offsetCm, outsideStudiedRange } = offsetFor(findings.offsetModel, findings.inclinationDeg)
  const measured = findings.columnTop === 'seen' || findings.columnTop === 'above-neck'
  const heightCm = measured ? verticalHeightCm(findings) : null
  const bound = boundOf(findings, heightCm)
  const venousSignCount = findings.venousSigns.length
  const common = {
    offsetCm,
    offsetModel: findings.offsetModel,
    observerSource: observer.source,
    outsideStudiedRange,
    venousSignCount,
    // Cook & Simel 1996: only a pulsation that was seen can be mistaken for the carotid.
    mayBeArterial: measured && venousSignCount < settings.minVenousSigns,
    hints: hintsFor(findings),
    caution: CAUTION_TEXT,
  }
  if (bound === 'none')
    return { ...common, cvpCmH2O: null, cvpMmHg: null, bandCmH2O: null, bandMmHg: null, heightCm: null, sigmaCm: null, bound, elevated: null, category: null, confidence: null }

  const sigmaRead = bound === 'upper' ? 0 : findings.readingPrecision === 'ruler' ? settings.sigmaReadRulerCm : settings.sigmaReadVisualCm
  const sigmaCm = Math.hypot(sigmaRead, offsetSigmaCm(findings, settings), observer.sigmaCm)
  const cvpCmH2O = withoutFloatNoise((heightCm ?? 0) + offsetCm)
  const low = bound === 'upper' ? null : cvpCmH2O - Z_95 * sigmaCm
  const high = bound === 'lower' ? null : cvpCmH2O + Z_95 * sigmaCm
  const bandCmH2O: [number | null, number | null] = [low, high]
  return {
    ...common,
    cvpCmH2O,
    cvpMmHg: cmH2OToMmHg(cvpCmH2O),
    bandCmH2O,
    bandMmHg: toMmHg(bandCmH2O),
    heightCm,
    sigmaCm,
    bound,
    // McGee 1998 (Am Heart J 136:10–18): elevated when the column top is more than 3 cm above the sternal angle.
    elevated: heightCm === null ? false : heightCm > settings.elevatedAboveCm,
    category: categoryOf(cvpCmH2O, settings),
    confidence: bandIsClear(bandCmH2O, settings) ? 'clear' : 'indeterminate',
  }
}

import type { Bound, ExamFindings, ObserverTerm } from '../schemas/exam.ts'
import type { EstimateSettings } from '../schemas/settings.ts'
import { inclineAdjustedOffset } from './offset.ts'
import { withoutFloatNoise } from './units.ts'

/** Two-sided 95% point of the normal distribution: the band of a point estimate. */
export const Z_TWO_SIDED_95 = 1.96
/** One-sided 95% point of the normal distribution: the single limit of a bound. */
export const Z_ONE_SIDED_95 = 1.645

export type Band = [low: number | null, high: number | null]

/** What the column top allows: a point, a lower bound (above the neck), an upper bound (not filled) or nothing. */
export function boundOf(columnTop: ExamFindings['columnTop'], heightCm: number | null): Bound {
  if (columnTop === 'not-filled') return 'upper'
  if (columnTop === 'not-assessable' || heightCm === null) return 'none'
  return columnTop === 'above-neck' ? 'lower' : 'point'
}

/**
 * σ of the offset, by inclination only: 1.0 cm within Seth 2002's studied angles (supine IQR 4.7–6.1 cm ÷ 1.349),
 * 2.0 cm above 60° (product default). The same for both offset models: the 5 cm convention's difference from the
 * CT-derived offset is a known, signed difference (reported as `conventionDiffCm`), not random error.
 */
export function offsetSigmaCm(findings: Pick<ExamFindings, 'inclinationDeg'>, settings: EstimateSettings): number {
  return inclineAdjustedOffset(findings.inclinationDeg).outsideStudiedRange ? settings.sigmaOffsetOutsideRangeCm : settings.sigmaOffsetCm
}

/**
 * σ of one estimate. Default terms: √(σ_read² + σ_offset² + σ_observer²) (product defaults but σ_offset). A local term
 * σ_exam already holds both examiners' reading and observer error, so it replaces σ_read and σ_observer together:
 * √(σ_exam² + σ_offset²). "Not filled" has no reading to err in: its default σ leaves σ_read out, while the observer
 * term still covers the judgement that no column was seen; a local σ_exam cannot be split and is used whole.
 */
export function sigmaFor(findings: ExamFindings, bound: Bound, settings: EstimateSettings, observer: ObserverTerm): number {
  const offset = offsetSigmaCm(findings, settings)
  if (observer.source !== 'default') return Math.hypot(observer.sigmaCm, offset)
  const read = findings.readingPrecision === 'ruler' ? settings.sigmaReadRulerCm : settings.sigmaReadVisualCm
  return Math.hypot(bound === 'upper' ? 0 : read, offset, observer.sigmaCm)
}

/**
 * The 95% band: CVP ± 1.96σ for a point; for a bound its one-sided 95% limit at 1.645σ, the other end open (null).
 */
export function bandFor(cvpCmH2O: number, sigmaCm: number, bound: Bound): Band {
  const clean = withoutFloatNoise
  if (bound === 'lower') return [clean(cvpCmH2O - Z_ONE_SIDED_95 * sigmaCm), null]
  if (bound === 'upper') return [null, clean(cvpCmH2O + Z_ONE_SIDED_95 * sigmaCm)]
  return [clean(cvpCmH2O - Z_TWO_SIDED_95 * sigmaCm), clean(cvpCmH2O + Z_TWO_SIDED_95 * sigmaCm)]
}

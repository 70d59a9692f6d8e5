import type { CvpCategory, EstimateV2, ExamFindings, ObserverTerm } from '../schemas/exam.ts'
import { DEFAULT_ESTIMATE_SETTINGS, type EstimateSettings } from '../schemas/settings.ts'
import { cautionsFor, type EstimateCore } from './cautions.ts'
import { bandFor, boundOf, sigmaFor, type Band } from './estimate-bounds.ts'
import { CAUTION_TEXT, categoriesInBand, elevatedOf } from './interpretation.ts'
import { FIXED_OFFSET_CM, inclineAdjustedOffset, offsetFor } from './offset.ts'
import { promptsFor } from './prompts.ts'
import { cmH2OToMmHg, withoutFloatNoise } from './units.ts'
import { hasArterialEvidence, venousSignCount } from './venous-signs.ts'

export type { ObserverTerm } from '../schemas/exam.ts'
export { hasArterialEvidence } from './venous-signs.ts'
export { offsetSigmaCm } from './estimate-bounds.ts'

export interface EstimateOptions {
  settings?: EstimateSettings
  /** The error term in force: a local one (pairs or rounds) once there is enough data, else the settings' default. */
  observer?: ObserverTerm
}

/** The settings' default error term: σ_observer, combined with σ_read. */
export function defaultObserverTerm(settings: EstimateSettings): ObserverTerm {
  return { source: 'default', sigmaCm: settings.sigmaObserverCm, n: null, ci: null }
}

/** Vertical height of the column top above the sternal angle: as read on a vertical ruler, or along the neck × sin θ. */
export function verticalHeightCm(findings: ExamFindings): number | null {
  if (findings.heightMethod === 'along-neck') {
    if (findings.alongNeckCm === null || findings.alongNeckCm === undefined) return null
    return withoutFloatNoise(findings.alongNeckCm * Math.sin((findings.inclinationDeg * Math.PI) / 180))
  }
  return findings.heightCm ?? null
}

const toMmHg = (band: Band): Band => [band[0] === null ? null : cmH2OToMmHg(band[0]), band[1] === null ? null : cmH2OToMmHg(band[1])]
const NO_NUMBERS = { cvpCmH2O: null, cvpMmHg: null, bandCmH2O: null, bandMmHg: null, sigmaCm: null }

/** CVP = h + offset (an upper bound: the offset alone), its σ and 95% band, in cmH₂O and mmHg (NIST SP 811 App. B.8). */
function numbersOf(findings: ExamFindings, settings: EstimateSettings, observer: ObserverTerm) {
  const measured = findings.columnTop === 'seen' || findings.columnTop === 'above-neck'
  const heightCm = measured ? verticalHeightCm(findings) : null
  const bound = boundOf(findings.columnTop, heightCm)
  const { offsetCm } = offsetFor(findings.offsetModel, findings.inclinationDeg)
  if (bound === 'none') return { ...NO_NUMBERS, heightCm, bound, offsetCm }
  const cvpCmH2O = withoutFloatNoise((heightCm ?? 0) + offsetCm)
  const sigmaCm = sigmaFor(findings, bound, settings, observer)
  const bandCmH2O = bandFor(cvpCmH2O, sigmaCm, bound)
  return { cvpCmH2O, cvpMmHg: cmH2OToMmHg(cvpCmH2O), bandCmH2O, bandMmHg: toMmHg(bandCmH2O), sigmaCm, heightCm, bound, offsetCm }
}

const confidenceOf = (categories: CvpCategory[]) => (categories.length === 0 ? null : categories.length === 1 ? 'clear' : 'indeterminate')

/**
 * The estimated CVP with its 95% band and interpretation (rules version 2). Pure; used offline and on the server, so
 * the band the device shows is the band the server stores when both use the same settings and error term.
 */
export function computeEstimate(findings: ExamFindings, options: EstimateOptions = {}): EstimateV2 {
  const settings = options.settings ?? DEFAULT_ESTIMATE_SETTINGS
  const observer = options.observer ?? defaultObserverTerm(settings)
  const numbers = numbersOf(findings, settings, observer)
  const incline = inclineAdjustedOffset(findings.inclinationDeg)
  const categories = categoriesInBand(numbers.bandCmH2O, settings)
  const core: EstimateCore = {
    rulesVersion: 2,
    ...numbers,
    offsetModel: findings.offsetModel,
    elevated: elevatedOf(numbers.bound, numbers.heightCm, settings),
    categories,
    confidence: confidenceOf(categories),
    conventionDiffCm: withoutFloatNoise(FIXED_OFFSET_CM - incline.offsetCm),
    ...{ observerSource: observer.source, observerSigmaCm: observer.sigmaCm, observerN: observer.n, observerSigmaCi: observer.ci },
    outsideStudiedRange: incline.outsideStudiedRange,
    arterialEvidence: hasArterialEvidence(findings),
    venousSignCount: venousSignCount(findings),
  }
  return { ...core, cautions: cautionsFor(findings, core, settings), prompts: promptsFor(findings), caution: CAUTION_TEXT }
}

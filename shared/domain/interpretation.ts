import type { CvpCategory, ExamFindings, Hint } from '../schemas/exam.ts'
import type { EstimateSettings } from '../schemas/settings.ts'

/** Shown on every result and export (§4.7). */
export const CAUTION_TEXT =
  'Estimate from physical examination, with a wide error band. It does not replace invasive measurement, ' +
  'clinical judgement, local protocols or licensed practice.'

/** Low below 5, normal 5–10 inclusive, high above 10 cmH₂O by default (categories of Cook 1990). */
export function categoryOf(cvpCmH2O: number, settings: EstimateSettings): CvpCategory {
  if (cvpCmH2O < settings.lowBelowCmH2O) return 'low'
  if (cvpCmH2O > settings.highAboveCmH2O) return 'high'
  return 'normal'
}

/** Whether a band whose open ends are null lies wholly inside one category. */
export function bandIsClear(band: [number | null, number | null], settings: EstimateSettings): boolean {
  const [low, high] = band
  if (low === null && high === null) return false
  if (low === null) return high! < settings.lowBelowCmH2O
  if (high === null) return low > settings.highAboveCmH2O
  return categoryOf(low, settings) === categoryOf(high, settings)
}

type HintRule = [applies: (f: ExamFindings) => boolean, hint: Hint]

// Patterns to consider, never diagnoses: Harrison's Manual of Medicine; Applefeld, Clinical Methods ch. 19.
const HINT_RULES: HintRule[] = [
  [(f) => f.waveform.aWave === 'cannon', { code: 'cannon-a-waves', finding: 'Cannon a waves', consider: 'atrioventricular dissociation' }],
  [(f) => f.waveform.aWave === 'absent', { code: 'absent-a-waves', finding: 'No a waves', consider: 'atrial fibrillation' }],
  [(f) => f.waveform.vWave === 'large', { code: 'large-v-waves', finding: 'Large v waves', consider: 'tricuspid regurgitation' }],
  [(f) => f.waveform.yDescent === 'steep', { code: 'steep-y-descent', finding: 'Steep y descent', consider: 'constrictive pericarditis' }],
  [
    (f) => f.respiratory === 'rises-on-inspiration',
    { code: 'kussmaul-sign', finding: 'Rises on inspiration (Kussmaul sign)', consider: 'constriction, restrictive cardiomyopathy or right-ventricular infarction' },
  ],
  [
    (f) => f.abdominojugular.done && f.abdominojugular.sustained === true && (f.abdominojugular.riseCm ?? 0) >= 4,
    { code: 'abdominojugular-positive', finding: 'Sustained rise of 4 cm or more with abdominal pressure', consider: 'raised right-sided filling pressure' },
  ],
  [
    (f) => f.vein === 'left-internal' || f.vein === 'left-external',
    { code: 'left-sided-vein', finding: 'Read on a left-sided vein', consider: 'a falsely high reading; confirm on the right internal jugular' },
  ],
]

/** The patterns the findings suggest, in a fixed order. */
export function hintsFor(findings: ExamFindings): Hint[] {
  return HINT_RULES.filter(([applies]) => applies(findings)).map(([, hint]) => ({ ...hint }))
}

import type { Caution, EstimateV2, ExamFindings } from '../schemas/exam.ts'
import type { EstimateSettings } from '../schemas/settings.ts'
import { CONTEXT_CAUTION_TEXT, LEFT_VEIN_CAUTION_TEXT, isLeftSided } from './context-cautions.ts'
import { frameNoteText, venousShortfallText } from './caution-text.ts'
import { FIXED_OFFSET_CM, SETH_2002_MEDIANS, inclineAdjustedOffset } from './offset.ts'
import { shortNumber as n } from './number-text.ts'
import { requiredVenousSigns } from './venous-signs.ts'

/** The estimate as far as the cautions read it. */
export type EstimateCore = Omit<EstimateV2, 'cautions' | 'prompts' | 'caution'>

const COOK_SIMEL = 'Cook & Simel 1996, JAMA 275:630–634'
const SETH = 'Seth 2002, J Gen Intern Med 17:861–865'

function arterial(f: ExamFindings, e: EstimateCore): Caution | null {
  if (!e.arterialEvidence) return null
  const palpable = f.venousSigns['not-palpable'] === 'absent' ? 'was palpable' : null
  const persists = f.venousSigns['obliterated-by-light-pressure'] === 'absent' ? 'persisted under light pressure at the base of the neck' : null
  const confirmed = f.venousConfirmed ? ' The examiner confirmed the column is venous.' : ' Confirm the column is venous before relying on this reading.'
  const what = [palpable, persists].filter(Boolean).join(' and ')
  return { code: 'arterial-evidence', text: `Arterial evidence: the pulsation ${what}, as the carotid does (${COOK_SIMEL}).${confirmed}` }
}

// Only a column that was seen can be mistaken for the carotid.
function fewSigns(f: ExamFindings, e: EstimateCore, s: EstimateSettings): Caution | null {
  if (f.columnTop !== 'seen' && f.columnTop !== 'above-neck') return null
  const required = requiredVenousSigns(f, s.minVenousSigns)
  if (e.venousSignCount >= required) return null
  const text = venousShortfallText(e.venousSignCount, required, s.minVenousSigns)
  return { code: 'few-venous-signs', text: `${text} (${COOK_SIMEL}).` }
}

/**
 * Elevated (a height rule) and the category (a CVP rule) point different ways for a point estimate: elevated while the
 * estimate is at or below the high threshold, or not elevated while it is above it.
 */
function frame(f: ExamFindings, e: EstimateCore, s: EstimateSettings): Caution | null {
  if (e.bound !== 'point' || e.cvpCmH2O === null || e.heightCm === null || e.elevated === null) return null
  if (e.elevated === e.cvpCmH2O > s.highAboveCmH2O) return null
  const seth = inclineAdjustedOffset(f.inclinationDeg).offsetCm
  return { code: 'frame-disagreement', text: `${frameNoteText(e.heightCm, e.cvpCmH2O, e.elevated, f.inclinationDeg, seth, s)} (${SETH}).` }
}

function convention(f: ExamFindings, e: EstimateCore): Caution | null {
  if (f.offsetModel !== 'fixed-5cm' || e.conventionDiffCm === null) return null
  const d = e.conventionDiffCm
  const where = d === 0 ? 'matches the CT-derived offset' : `sits ${n(Math.abs(d))} cm ${d < 0 ? 'below' : 'above'} the CT-derived offset`
  const effect = d === 0 ? '' : `: this estimate reads ${n(Math.abs(d))} cmH₂O ${d < 0 ? 'lower' : 'higher'} than with the incline-adjusted offset`
  const text = `The ${FIXED_OFFSET_CM} cm convention ${where} at ${n(f.inclinationDeg)}° (${SETH})${effect}. A known difference, not random error: the band does not include it.`
  return { code: 'convention-offset', text }
}

function outsideRange(f: ExamFindings, e: EstimateCore, s: EstimateSettings): Caution | null {
  if (!e.outsideStudiedRange) return null
  const [deg, cm] = SETH_2002_MEDIANS[SETH_2002_MEDIANS.length - 1]!
  const text = `At ${n(f.inclinationDeg)}° the trunk is steeper than the ${deg}° up to which the offset was measured (${SETH}): the CT-derived offset is held at its ${deg}° value, ${n(cm)} cm, and the offset error widened to ${n(s.sigmaOffsetOutsideRangeCm)} cm.`
  return { code: 'outside-studied-range', text }
}

/** Measurement cautions beside the number, never diagnoses; arterial evidence always first. */
export function cautionsFor(findings: ExamFindings, estimate: EstimateCore, settings: EstimateSettings): Caution[] {
  const cautions = [
    arterial(findings, estimate),
    fewSigns(findings, estimate, settings),
    frame(findings, estimate, settings),
    convention(findings, estimate),
    isLeftSided(findings.vein) ? { code: 'left-sided-vein' as const, text: LEFT_VEIN_CAUTION_TEXT } : null,
    outsideRange(findings, estimate, settings),
    ...findings.context.map((flag) => ({ code: flag, text: CONTEXT_CAUTION_TEXT[flag] })),
  ]
  return cautions.filter((caution) => caution !== null)
}

import { VenousSignSchema, type ExamFindings } from '../schemas/exam.ts'

type SignFindings = Pick<ExamFindings, 'venousSigns' | 'rhythm' | 'respiratory'>

/**
 * A pulsation that is palpable, or that persists under light pressure at the base of the neck, behaves like the carotid
 * (Cook & Simel 1996, JAMA 275:630–634).
 */
export function hasArterialEvidence(findings: Pick<ExamFindings, 'venousSigns'>): boolean {
  const signs = findings.venousSigns
  return signs['not-palpable'] === 'absent' || signs['obliterated-by-light-pressure'] === 'absent'
}

/** The venous signs recorded present (Cook & Simel 1996's table). */
export function venousSignCount(findings: Pick<ExamFindings, 'venousSigns'>): number {
  return VenousSignSchema.options.filter((sign) => findings.venousSigns[sign] === 'present').length
}

/**
 * Signs that this patient's rhythm or breathing pattern makes absent, so their absence does not count against the vein:
 * in atrial fibrillation there is no a wave and the pulsation is single-peaked; with a Kussmaul pattern the column does
 * not fall on inspiration (Harrison's Manual of Medicine). A sign recorded present still counts as present.
 */
export function expectedAbsentSigns(findings: SignFindings): number {
  const af = findings.rhythm === 'atrial-fibrillation' && findings.venousSigns['double-peaked'] !== 'present'
  const kussmaul = findings.respiratory === 'rises-on-inspiration' && findings.venousSigns['falls-on-inspiration'] !== 'present'
  return Number(af) + Number(kussmaul)
}

/**
 * How many signs a seen column needs for no warning: the `minVenousSigns` setting, capped by the signs that could be
 * present here (six less those the rhythm or breathing pattern makes absent). So with a setting of 5 or 6, a patient
 * in atrial fibrillation is not warned for lacking a double peak; at the default 3 the cap never bites.
 */
export function requiredVenousSigns(findings: SignFindings, minVenousSigns: number): number {
  return Math.min(minVenousSigns, VenousSignSchema.options.length - expectedAbsentSigns(findings))
}

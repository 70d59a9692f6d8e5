// NIST SP 811 (2008), Appendix B.8: conventional centimeter of water 9.806 65 E+01 Pa and millimeter of mercury
// 1.333 224 E+02 Pa; the latter is exactly 13.5951 g/cm³ × 9.80665 m/s² × 1 mm = 133.322387415 Pa.
export const PASCALS_PER_CMH2O = 98.0665
export const PASCALS_PER_MMHG = 133.322387415

/** cmH₂O per mmHg (≈ 1.35951). */
export const CMH2O_PER_MMHG = PASCALS_PER_MMHG / PASCALS_PER_CMH2O

/** Converts a pressure from cmH₂O to mmHg. */
export function cmH2OToMmHg(cmH2O: number): number {
  return cmH2O / CMH2O_PER_MMHG
}

/** Converts a pressure from mmHg to cmH₂O. */
export function mmHgToCmH2O(mmHg: number): number {
  return mmHg * CMH2O_PER_MMHG
}

/**
 * Drops binary floating-point noise below 1e-9 (e.g. 9.7 + −4.7 = 4.999999999999999), so values entered as decimals
 * meet the decimal thresholds of the interpretation exactly. Far below any bedside reading.
 */
export function withoutFloatNoise(value: number): number {
  return Math.round(value * 1e9) / 1e9
}

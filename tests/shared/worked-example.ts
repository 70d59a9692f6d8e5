import type { ExamInputRaw } from '#shared/schemas/exam'

/**
 * The findings of the worked example: vertical h = 4 cm at 45°, ruler, incline-adjusted → 13.7 cmH₂O, band 9.2–18.2.
 * Three venous signs present (Cook & Simel 1996, JAMA 275:630–634), none absent: no arterial evidence, no warning.
 */
export const WORKED_EXAMPLE_FINDINGS = {
  inclinationDeg: 45,
  inclinationSource: 'entered',
  vein: 'right-internal',
  columnTop: 'seen',
  heightMethod: 'vertical',
  heightCm: 4,
  readingPrecision: 'ruler',
  offsetModel: 'incline-adjusted',
  venousSigns: { 'not-palpable': 'present', 'double-peaked': 'present', 'falls-on-inspiration': 'present' },
  rhythm: 'sinus',
  waveform: { aWave: 'normal', vWave: 'normal', yDescent: 'normal' },
  respiratory: 'falls-on-inspiration',
  abdominojugular: { done: false },
} satisfies Partial<ExamInputRaw>

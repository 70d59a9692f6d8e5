import type { ExamInputRaw } from '#shared/schemas/exam'

/** The findings of PRODUCT.md §4's worked example: vertical h = 4 cm at 45°, ruler, incline-adjusted → 13.7 cmH₂O. */
export const WORKED_EXAMPLE_FINDINGS = {
  inclinationDeg: 45,
  inclinationSource: 'entered',
  vein: 'right-internal',
  columnTop: 'seen',
  heightMethod: 'vertical',
  heightCm: 4,
  readingPrecision: 'ruler',
  offsetModel: 'incline-adjusted',
  venousSigns: ['not-palpable', 'double-peaked', 'falls-on-inspiration'],
  rhythm: 'sinus',
  waveform: { aWave: 'normal', vWave: 'normal', yDescent: 'normal' },
  respiratory: 'falls-on-inspiration',
  abdominojugular: { done: false },
} satisfies Partial<ExamInputRaw>

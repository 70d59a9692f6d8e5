import type { OffsetModel } from '../schemas/exam.ts'
import { withoutFloatNoise } from './units.ts'

/**
 * Sternal angle to mid right atrium, CT-derived medians by trunk inclination:
 * Seth R, Magner P, Matzinger F, van Walraven C. J Gen Intern Med 2002;17:861–865.
 */
export const SETH_2002_MEDIANS: readonly (readonly [deg: number, cm: number])[] = [
  [0, 5.4],
  [30, 8.0],
  [45, 9.7],
  [60, 9.8],
]

/** The classical fixed offset of 5 cm, at every inclination. */
export const FIXED_OFFSET_CM = 5

export interface Offset {
  offsetCm: number
  /** The inclination lies above the steepest angle the offset study measured. */
  outsideStudiedRange: boolean
}

/** Piecewise-linear offset through the Seth 2002 medians, held at the last median above 60°. */
export function inclineAdjustedOffset(inclinationDeg: number): Offset {
  const last = SETH_2002_MEDIANS[SETH_2002_MEDIANS.length - 1]!
  if (inclinationDeg > last[0]) return { offsetCm: last[1], outsideStudiedRange: true }
  for (let i = 1; i < SETH_2002_MEDIANS.length; i++) {
    const [x0, y0] = SETH_2002_MEDIANS[i - 1]!
    const [x1, y1] = SETH_2002_MEDIANS[i]!
    if (inclinationDeg <= x1) {
      const t = (Math.max(inclinationDeg, x0) - x0) / (x1 - x0)
      return { offsetCm: withoutFloatNoise(y0 + t * (y1 - y0)), outsideStudiedRange: false }
    }
  }
  return { offsetCm: last[1], outsideStudiedRange: false }
}

/** The offset a model adds to the height; the range flag always reflects the studied angles. */
export function offsetFor(model: OffsetModel, inclinationDeg: number): Offset {
  const adjusted = inclineAdjustedOffset(inclinationDeg)
  return model === 'fixed-5cm' ? { offsetCm: FIXED_OFFSET_CM, outsideStudiedRange: adjusted.outsideStudiedRange } : adjusted
}

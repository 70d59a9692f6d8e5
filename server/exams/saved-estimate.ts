import type { EstimateV2, ExamInput, ReviewedBand } from '#shared/schemas/exam'
import { estimateWith, type EstimateContext } from '../settings/settings-estimate.ts'

/** Half the last decimal a band is shown with: a band reviewed as 9.2–18.2 is the band stored as 9.24–18.16. */
export const REVIEWED_BAND_TOLERANCE_CM = 0.05

type Band = EstimateV2['bandCmH2O']

function sameEnd(a: number | null, b: number | null): boolean {
  return a === null || b === null ? a === b : Math.abs(a - b) <= REVIEWED_BAND_TOLERANCE_CM
}

function sameBand(a: Band, b: Band): boolean {
  if (a === null || b === null) return a === b
  return sameEnd(a[0], b[0]) && sameEnd(a[1], b[1])
}

/** Whether the examiner saw another band than the one stored, e.g. because the error term changed in between. */
export function reviewedDiffers(estimate: EstimateV2, reviewed: ReviewedBand): boolean {
  return reviewed.observerSource !== estimate.observerSource || !sameBand(reviewed.bandCmH2O, estimate.bandCmH2O)
}

/**
 * The estimate stored with a saved record: the server's own, never the client's numbers. When the band the examiner
 * reviewed differs from it, the reviewed band is kept beside it so the record says so plainly, with both bands.
 */
export function savedEstimate(input: ExamInput, context: EstimateContext): EstimateV2 {
  const estimate = estimateWith(input, context)
  return input.reviewed && reviewedDiffers(estimate, input.reviewed) ? { ...estimate, reviewed: input.reviewed } : estimate
}

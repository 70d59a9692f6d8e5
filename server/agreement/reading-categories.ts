import { categoryOf } from '#shared/domain/interpretation'
import { CvpCategorySchema, type CvpCategory } from '#shared/schemas/exam'
import { DEFAULT_ESTIMATE_SETTINGS } from '#shared/schemas/settings'
import type { Reading } from './pairs.ts'

// The estimate's own interpretation rules applied to the stored h and CVP columns: both readings of a pair are
// judged by one set of thresholds, and the estimate JSON of every exam need not be parsed.
const settings = DEFAULT_ESTIMATE_SETTINGS

/** The declared, ordered category scale of the weighted kappa. */
export const CATEGORY_SCALE: readonly CvpCategory[] = CvpCategorySchema.options

export const categoryOfReading = (r: Reading): CvpCategory => categoryOf(r.cvpCmH2O, settings)

export const isElevated = (r: Reading): boolean => r.heightCm > settings.elevatedAboveCm

import { categoryOf, elevatedOf } from '#shared/domain/interpretation'
import { CvpCategorySchema, type CvpCategory } from '#shared/schemas/exam'
import { DEFAULT_ESTIMATE_SETTINGS } from '#shared/schemas/settings'
import type { Reading } from './pairs.ts'

// The estimate's own interpretation rules applied to the stored h and CVP columns: both readings of a pair are
// judged by one set of thresholds, and the estimate JSON of every exam need not be parsed. `reading-levels-sql.ts`
// writes the same rules in SQL.
const settings = DEFAULT_ESTIMATE_SETTINGS

/** The declared, ordered category scale of the weighted kappa. */
export const CATEGORY_SCALE: readonly CvpCategory[] = CvpCategorySchema.options

/** A point height: the only readings Bland–Altman, the ICC, the examiners' bias and the trend take. */
export const isPoint = (r: Reading): boolean => r.columnTop === 'seen'

/** h of a point reading; a bound here is a bug in the caller, which should have kept only points. */
export function pointHeight(r: Reading): number {
  if (r.columnTop !== 'seen' || r.heightCm === null) throw new Error(`Exam ${r.examId} is a bound, not a point height`)
  return r.heightCm
}

/** The category of a point estimate (Cook 1990: low < 5, normal 5–10, high > 10 cmH₂O). */
export const categoryOfReading = (r: Reading): CvpCategory => categoryOf(r.cvpCmH2O, settings)

/**
 * The category a reading decides, or null. A point: its estimate's. A bound decides one only when every value it allows
 * lies in one category: a lower bound (CVP ≥ h + offset) above the high threshold is high, an upper bound (CVP ≤ the
 * offset) below the low threshold is low; any other bound reaches two or three categories and decides none.
 */
export function decidedCategory(r: Reading): CvpCategory | null {
  const category = categoryOfReading(r)
  if (r.columnTop === 'above-neck') return category === 'high' ? category : null
  if (r.columnTop === 'not-filled') return category === 'low' ? category : null
  return category
}

const BOUND = { seen: 'point', 'above-neck': 'lower', 'not-filled': 'upper' } as const

/**
 * Elevated (h > 3 cm, McGee 1998, Am Heart J 136:10–18), not elevated, or null when the reading cannot say: a lower
 * bound at or below the threshold. An upper bound ("no column even lying flat") is not elevated.
 */
export const elevatedOfReading = (r: Reading): boolean | null => elevatedOf(BOUND[r.columnTop], r.heightCm, settings)

/** The elevated threshold in force (cm above the sternal angle), for the reasons the summary gives. */
export const ELEVATED_ABOVE_CM = settings.elevatedAboveCm
/** The category thresholds in force (cmH₂O): low below the first, high above the second. */
export const CATEGORY_LIMITS = { lowBelow: settings.lowBelowCmH2O, highAbove: settings.highAboveCmH2O } as const

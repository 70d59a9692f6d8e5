import { CvpCategorySchema, type Bound, type CvpCategory } from '../schemas/exam.ts'
import type { EstimateSettings } from '../schemas/settings.ts'
import { withoutFloatNoise } from './units.ts'

/** Shown on every result, list and export. */
export const CAUTION_TEXT =
  'Estimate from physical examination, with a wide error band. It does not replace invasive measurement, ' +
  'clinical judgement, local protocols or licensed practice. Upright patients with heart failure may read lower ' +
  'than a supine catheter value (McGee 1998).'

const ORDER = CvpCategorySchema.options

/** Low below 5, normal 5–10 inclusive, high above 10 cmH₂O by default (categories of Cook 1990, Am J Med Sci, PMID 2316561). */
export function categoryOf(cvpCmH2O: number, settings: EstimateSettings): CvpCategory {
  const value = withoutFloatNoise(cvpCmH2O)
  if (value < settings.lowBelowCmH2O) return 'low'
  if (value > settings.highAboveCmH2O) return 'high'
  return 'normal'
}

/**
 * The categories a 95% band reaches, low to high. An open end (null) reaches every category beyond the other end: a
 * lower bound reaches its limit's category and those above, an upper bound its limit's category and those below.
 */
export function categoriesInBand(band: readonly [number | null, number | null] | null, settings: EstimateSettings): CvpCategory[] {
  if (!band || (band[0] === null && band[1] === null)) return []
  const from = band[0] === null ? 0 : ORDER.indexOf(categoryOf(band[0], settings))
  const to = band[1] === null ? ORDER.length - 1 : ORDER.indexOf(categoryOf(band[1], settings))
  return ORDER.slice(from, to + 1)
}

/**
 * JVP elevated when the top of the column is more than 3 cm (setting) above the sternal angle: McGee 1998, Am Heart J
 * 136:10–18. A lower bound above the threshold is elevated; one at or below it cannot say (null); an upper bound ("no
 * column even lying flat") is not elevated; no estimate, null.
 */
export function elevatedOf(bound: Bound, heightCm: number | null, settings: EstimateSettings): boolean | null {
  if (bound === 'upper') return false
  if (bound === 'none' || heightCm === null) return null
  const above = withoutFloatNoise(heightCm) > settings.elevatedAboveCm
  if (bound === 'lower') return above ? true : null
  return above
}

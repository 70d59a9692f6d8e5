import { quoteName } from '../db/quote.ts'
import { CATEGORY_LIMITS, CATEGORY_SCALE, ELEVATED_ABOVE_CM } from './reading-categories.ts'

export type Side = 'earlier' | 'later'

/**
 * The interpretation compares a value after `withoutFloatNoise` (shared/domain/units.ts) has rounded it to 1e-9:
 * round(x·1e9)/1e9 > t holds exactly when x ≥ t + 0.5e-9, and < t when x < t − 0.5e-9. Plain comparisons, so the
 * database needs no rounding function of its own.
 */
const HALF_NOISE = 0.5e-9
const ELEVATED_FROM = ELEVATED_ABOVE_CM + HALF_NOISE
const LOW_BELOW = CATEGORY_LIMITS.lowBelow - HALF_NOISE
const HIGH_FROM = CATEGORY_LIMITS.highAbove + HALF_NOISE
const [LOW, NORMAL, HIGH] = (['low', 'normal', 'high'] as const).map((c) => CATEGORY_SCALE.indexOf(c))

const column = (side: Side, name: string) => quoteName(`${side}${name}`)

/**
 * `elevatedOfReading` (reading-categories.ts) in SQL, as a level: 1 elevated (h > 3 cm, McGee 1998, Am Heart J
 * 136:10–18), 0 not, NULL when the reading cannot say (a lower bound at or below the threshold). Not filled is not
 * elevated.
 */
export function elevatedLevelSql(side: Side): string {
  const above = `${column(side, 'HeightCm')} >= ${ELEVATED_FROM}`
  return (
    `CASE ${column(side, 'ColumnTop')} WHEN 'seen' THEN CASE WHEN ${above} THEN 1 ELSE 0 END ` +
    `WHEN 'above-neck' THEN CASE WHEN ${above} THEN 1 END WHEN 'not-filled' THEN 0 END`
  )
}

/**
 * `decidedCategory` (reading-categories.ts) in SQL, as its index on the category scale (Cook 1990: low < 5, normal
 * 5–10, high > 10 cmH₂O); NULL for a bound that reaches more than one category.
 */
export function categoryLevelSql(side: Side): string {
  const cvp = column(side, 'CvpCmH2O')
  const [low, high] = [`${cvp} < ${LOW_BELOW}`, `${cvp} >= ${HIGH_FROM}`]
  return (
    `CASE ${column(side, 'ColumnTop')} WHEN 'seen' THEN CASE WHEN ${low} THEN ${LOW} WHEN ${high} THEN ${HIGH} ELSE ${NORMAL} END ` +
    `WHEN 'above-neck' THEN CASE WHEN ${high} THEN ${HIGH} END WHEN 'not-filled' THEN CASE WHEN ${low} THEN ${LOW} END END`
  )
}

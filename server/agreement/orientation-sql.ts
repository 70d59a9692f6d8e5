import type { Sequelize } from 'sequelize'
import { quoteName } from '../db/quote.ts'

const [earlierExaminer, laterExaminer] = [quoteName('earlierExaminerId'), quoteName('laterExaminerId')]
const [earlierHeight, laterHeight] = [quoteName('earlierHeightCm'), quoteName('laterHeightCm')]

/**
 * `flips` (pairs.ts) in SQL: true when the later reading comes first in the difference, the attending having examined
 * first and a resident after. The attendings are few (every account is read for the examiners' names), so a list.
 */
export function flipsSql(sequelize: Sequelize, attendingIds: readonly string[]): string {
  if (!attendingIds.length) return '1 = 0'
  const list = attendingIds.map((id) => sequelize.escape(id)).join(', ')
  return `(${earlierExaminer} IN (${list}) AND ${laterExaminer} NOT IN (${list}))`
}

/** first − second height of a point pair: resident − attending, else earlier − later. */
export const differenceSql = (flips: string) =>
  `CASE WHEN ${flips} THEN ${laterHeight} - ${earlierHeight} ELSE ${earlierHeight} - ${laterHeight} END`

/** The exam id of the pair's first reading in the difference. */
export const firstExamIdSql = (flips: string) =>
  `CASE WHEN ${flips} THEN ${quoteName('laterExamId')} ELSE ${quoteName('earlierExamId')} END`

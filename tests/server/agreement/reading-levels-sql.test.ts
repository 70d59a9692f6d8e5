import { QueryTypes } from 'sequelize'
import { describe, expect, it } from 'vitest'
import { PAIR_COLUMN_TOPS, type Reading } from '../../../server/agreement/pairs.ts'
import { CATEGORY_SCALE, decidedCategory, elevatedOfReading } from '../../../server/agreement/reading-categories.ts'
import { categoryLevelSql, elevatedLevelSql } from '../../../server/agreement/reading-levels-sql.ts'
import { openTestDatabase } from '../helpers.ts'

// At, just inside and just outside each threshold (3 cm; 5 and 10 cmH₂O), with noise below and above the 1e-9 the
// interpretation rounds away.
const HEIGHTS = [-1, 2.9999999, 3 - 4e-10, 3, 3 + 1e-10, 3 + 4e-10, 3 + 6e-10, 3 + 1e-9, 3.5, 12]
const CVPS = [-1, 4.9999999, 5 - 6e-10, 5 - 4e-10, 5, 5 + 1e-10, 7.5, 10 - 1e-10, 10, 10 + 4e-10, 10 + 6e-10, 10.0000001, 16]

const readingOf = (columnTop: Reading['columnTop'], heightCm: number | null, cvpCmH2O: number): Reading => ({
  ...{ examId: 'exam', patientCode: 'SM-0142', examinerId: 'examiner', teamId: 'team', at: 0 },
  ...{ heightCm, cvpCmH2O, inclinationDeg: 45, vein: 'right-internal', columnTop },
})

const READINGS = PAIR_COLUMN_TOPS.flatMap((top) =>
  (top === 'not-filled' ? [null] : HEIGHTS).flatMap((h) => CVPS.map((cvp) => readingOf(top, h, cvp))),
)

describe('the kappas’ levels in SQL (reading-levels-sql.ts)', () => {
  it('give the level the JavaScript rules give, for each column top at and around every threshold', async () => {
    const sequelize = await openTestDatabase()
    const levelsOf = async (r: Reading) => {
      const sql =
        `SELECT ${elevatedLevelSql('later')} AS "elevated", ${categoryLevelSql('later')} AS "category" FROM ` +
        `(SELECT :top AS "laterColumnTop", CAST(:h AS DOUBLE PRECISION) AS "laterHeightCm", CAST(:cvp AS DOUBLE PRECISION) AS "laterCvpCmH2O") AS "reading"`
      const replacements = { top: r.columnTop, h: r.heightCm, cvp: r.cvpCmH2O }
      const [row] = await sequelize.query<{ elevated: number | null; category: number | null }>(sql, { replacements, type: QueryTypes.SELECT })
      return row!
    }

    const fromSql = []
    for (const r of READINGS) fromSql.push(await levelsOf(r))

    const expected = READINGS.map((r) => {
      const [elevated, category] = [elevatedOfReading(r), decidedCategory(r)]
      return { elevated: elevated === null ? null : Number(elevated), category: category === null ? null : CATEGORY_SCALE.indexOf(category) }
    })
    expect(fromSql).toEqual(expected)
    // Each level occurs, so the comparison covers every branch.
    expect(new Set(expected.map((e) => e.elevated))).toEqual(new Set([null, 0, 1]))
    expect(new Set(expected.map((e) => e.category))).toEqual(new Set([null, 0, 1, 2]))
  })
})

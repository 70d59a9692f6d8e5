import { QueryTypes, type WhereOptions } from 'sequelize'
import { EXAM_COUNT_CAP } from '#shared/schemas/exam'
import { ExamModel } from '../models/index.ts'

interface SelectQueryGenerator {
  selectQuery(
    table: string,
    options: { attributes: string[]; where: WhereOptions<ExamModel>; limit: number },
    model: typeof ExamModel,
  ): string
}

/**
 * How many rows match, counted up to the cap in SQL, so a reader of a million exams costs a bounded index walk and
 * no row leaves the database; `capped` when more match.
 */
export async function cappedCount(where: WhereOptions<ExamModel>): Promise<{ total: number; capped: boolean }> {
  const sequelize = ExamModel.sequelize!
  const generator = sequelize.getQueryInterface().queryGenerator as SelectQueryGenerator
  const inner = generator.selectQuery(ExamModel.tableName, { attributes: ['id'], where, limit: EXAM_COUNT_CAP + 1 }, ExamModel)
  const [row] = await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM (${inner.replace(/;\s*$/, '')}) AS "capped"`, {
    type: QueryTypes.SELECT,
  })
  const n = row?.n ?? 0
  return { total: Math.min(n, EXAM_COUNT_CAP), capped: n > EXAM_COUNT_CAP }
}

import { literal, Op, type WhereOptions } from 'sequelize'
import { z } from 'zod'
import { SignoffQueueOrderSchema, type SignoffQueueOrder } from '#shared/schemas/signoff-queue'
import { invalidInput } from '../errors.ts'
import { encodeCursor, readCursor } from '../exams/exam-keyset.ts'
import { ExamModel } from '../models/index.ts'

/** The order it was made in, the last exam of the page before (submission time and id), and the first page's count. */
const CursorSchema = z.object({
  o: SignoffQueueOrderSchema,
  v: z.iso.datetime(),
  i: z.string(),
  t: z.number().int().min(0),
  c: z.boolean(),
})
export type QueueCursor = z.infer<typeof CursorSchema>

/** The cursor sent back; one made in the other order (or not by the queue) would skip or repeat exams, so it is refused. */
export function decodeQueueCursor(text: string, order: SignoffQueueOrder): QueueCursor {
  const parsed = CursorSchema.safeParse(readCursor(text))
  if (!parsed.success || parsed.data.o !== order) {
    throw invalidInput({ cursor: 'This cursor is not from the sign-off queue in this order; start again from the first page' })
  }
  return parsed.data
}

export function queueCursorAfter(row: ExamModel, order: SignoffQueueOrder, total: number, capped: boolean): string | null {
  if (!row.submittedAt) return null
  return encodeCursor({ o: order, v: row.submittedAt.toISOString(), i: row.id, t: total, c: capped } satisfies QueueCursor)
}

/** Rows strictly after the cursor in (submittedAt, id) order, either way: one range of the status-team-submission index. */
export function afterCursor(where: WhereOptions<ExamModel>, cursor: QueueCursor): WhereOptions<ExamModel> {
  const sequelize = ExamModel.sequelize!
  const op = cursor.o === 'oldest' ? '>' : '<'
  const after = literal(`("submittedAt", "id") ${op} (${sequelize.escape(new Date(cursor.v))}, ${sequelize.escape(cursor.i)})`)
  return { [Op.and]: [where, after] }
}

/** ORDER BY of the order asked for; ties broken by id in the same direction, as the keyset compares. */
export function queueOrder(order: SignoffQueueOrder): [string, 'ASC' | 'DESC'][] {
  const direction = order === 'oldest' ? 'ASC' : 'DESC'
  return [
    ['submittedAt', direction],
    ['id', direction],
  ]
}

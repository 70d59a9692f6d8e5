import { literal, Op, type WhereOptions } from 'sequelize'
import { z } from 'zod'
import { EXAM_COUNT_CAP } from '#shared/schemas/exam'
import type { SignoffQueue, SignoffQueueQuery } from '#shared/schemas/signoff-queue'
import type { User } from '#shared/schemas/user'
import { invalidInput } from '../errors.ts'
import { cappedCount } from '../exams/exam-count.ts'
import { encodeCursor, readCursor } from '../exams/exam-keyset.ts'
import { presentPage } from '../exams/exam-page.ts'
import { ExamModel } from '../models/index.ts'
import { blinded, blindingClause } from '../rounds/round-blinding.ts'
import { teamIdsOf } from '../users/team-members.ts'
import { READING_EXAM_IDS } from './review-access.ts'

/** What the attending may countersign: submitted exams filed to their teams, by anyone but themselves. */
async function waitingFor(attending: User): Promise<WhereOptions<ExamModel>> {
  const waiting = {
    status: 'submitted',
    teamId: { [Op.in]: teamIdsOf(attending) },
    examinerId: { [Op.ne]: attending.id },
    id: { [Op.notIn]: literal(READING_EXAM_IDS) },
  }
  // Entries of an open calibration round join the queue once the round closes (blinding, server/rounds).
  return blinded(waiting, await blindingClause(attending.id))!
}

/** The last exam of the page before (its submission time and id) and the count made on the first page. */
const CursorSchema = z.object({ v: z.iso.datetime(), i: z.string(), t: z.number().int().min(0), c: z.boolean() })
type Cursor = z.infer<typeof CursorSchema>

function decode(text: string): Cursor {
  const parsed = CursorSchema.safeParse(readCursor(text))
  if (!parsed.success) throw invalidInput({ cursor: 'This cursor is not from the sign-off queue; start again from the first page' })
  return parsed.data
}

/** After the cursor in (submittedAt, id) order: one range of the status-team-submission index, however deep. */
async function pageStart(where: WhereOptions<ExamModel>, query: SignoffQueueQuery) {
  if (!query.cursor) {
    const offset = (query.page - 1) * query.pageSize
    if (offset >= EXAM_COUNT_CAP) throw invalidInput({ page: 'Pages this deep are reached with the cursor of the page before' })
    return { where, offset, ...(await cappedCount(where)) }
  }
  const cursor = decode(query.cursor)
  const sequelize = ExamModel.sequelize!
  const after = literal(`("submittedAt", "id") > (${sequelize.escape(new Date(cursor.v))}, ${sequelize.escape(cursor.i)})`)
  return { where: { [Op.and]: [where, after] }, offset: 0, total: cursor.t, capped: cursor.c }
}

/** The attending's sign-off queue, the longest-waiting first. */
export async function signoffQueue(attending: User, query: SignoffQueueQuery): Promise<SignoffQueue> {
  const start = await pageStart(await waitingFor(attending), query)
  const rows = await ExamModel.findAll({
    where: start.where,
    order: [
      ['submittedAt', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: query.pageSize + 1,
    offset: start.offset,
  })
  const page = rows.slice(0, query.pageSize)
  // Team attendings see the real codes of their teams' submitted exams (exam-access.ts).
  const exams = await presentPage(page, (r) => r.patientCode)
  const now = Date.now()
  const items = exams.map((exam, i) => ({
    exam,
    waitingSeconds: Math.max(0, Math.floor((now - (page[i]!.submittedAt?.getTime() ?? now)) / 1000)),
  }))
  const last = page.at(-1)
  const nextCursor =
    rows.length > query.pageSize && last?.submittedAt
      ? encodeCursor({ v: last.submittedAt.toISOString(), i: last.id, t: start.total, c: start.capped })
      : null
  return { items, total: start.total, totalCapped: start.capped, page: query.page, pageSize: query.pageSize, nextCursor }
}

export async function signoffCount(attending: User): Promise<{ count: number }> {
  return { count: await ExamModel.count({ where: await waitingFor(attending) }) }
}

import { fn, col, Op, type WhereOptions } from 'sequelize'
import { EXAM_COUNT_CAP } from '#shared/schemas/exam'
import type { SignoffQueue, SignoffQueueQuery, SignoffQueueResident } from '#shared/schemas/signoff-queue'
import type { User } from '#shared/schemas/user'
import { invalidInput } from '../errors.ts'
import { cappedCount } from '../exams/exam-count.ts'
import type { PageCache } from '../exams/exam-caches.ts'
import { presentPage } from '../exams/exam-page.ts'
import { ExamModel, UserModel } from '../models/index.ts'
import { afterCursor, decodeQueueCursor, queueCursorAfter, queueOrder } from './signoff-queue-cursor.ts'
import { filteredQueue, waitingFor } from './signoff-queue-scope.ts'

/** The first page's rows by number (counted), or the rows after the cursor (the count carried on). */
async function pageStart(where: WhereOptions<ExamModel>, query: SignoffQueueQuery) {
  if (!query.cursor) {
    const offset = (query.page - 1) * query.pageSize
    if (offset >= EXAM_COUNT_CAP) throw invalidInput({ page: 'Pages this deep are reached with the cursor of the page before' })
    return { where, offset, ...(await cappedCount(where)) }
  }
  const cursor = decodeQueueCursor(query.cursor, query.order)
  return { where: afterCursor(where, cursor), offset: 0, total: cursor.t, capped: cursor.c }
}

/**
 * The attending's sign-off queue, oldest or newest submission first, narrowed by search and resident. With a cache
 * (exam-caches.ts), exams presented for an earlier read and unchanged since are not built again.
 */
export async function signoffQueue(attending: User, query: SignoffQueueQuery, cache?: PageCache): Promise<SignoffQueue> {
  const start = await pageStart(await filteredQueue(attending, query), query)
  const rows = await ExamModel.findAll({
    where: start.where,
    order: queueOrder(query.order),
    limit: query.pageSize + 1,
    offset: start.offset,
  })
  const page = rows.slice(0, query.pageSize)
  // Team attendings see the real codes of their teams' submitted exams (exam-access.ts).
  const exams = await presentPage(page, (r) => r.patientCode, cache)
  const now = Date.now()
  const items = exams.map((exam, i) => ({
    exam,
    waitingSeconds: Math.max(0, Math.floor((now - (page[i]!.submittedAt?.getTime() ?? now)) / 1000)),
  }))
  const last = page.at(-1)
  const nextCursor = rows.length > query.pageSize && last ? queueCursorAfter(last, query.order, start.total, start.capped) : null
  return { items, total: start.total, totalCapped: start.capped, page: query.page, pageSize: query.pageSize, nextCursor }
}

export async function signoffCount(attending: User): Promise<{ count: number }> {
  return { count: await ExamModel.count({ where: await waitingFor(attending) }) }
}

/** How many exams of each resident wait for the attending, by name, for filter chips. */
export async function signoffResidents(attending: User): Promise<{ residents: SignoffQueueResident[] }> {
  const groups = (await ExamModel.findAll({
    attributes: ['examinerId', [fn('COUNT', col('id')), 'n']],
    where: await waitingFor(attending),
    group: ['examinerId'],
    raw: true,
  })) as unknown as { examinerId: string; n: number | string }[]
  const users = await UserModel.findAll({
    attributes: ['id', 'displayName'],
    where: { id: { [Op.in]: groups.map((g) => g.examinerId) } },
    raw: true,
  })
  const names = new Map(users.map((u) => [u.id, u.displayName]))
  const residents = groups.map((g) => ({ residentId: g.examinerId, name: names.get(g.examinerId) ?? 'Unknown', count: Number(g.n) }))
  return { residents: residents.sort((a, b) => a.name.localeCompare(b.name) || a.residentId.localeCompare(b.residentId)) }
}

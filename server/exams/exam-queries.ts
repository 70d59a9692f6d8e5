import { Op, type WhereOptions } from 'sequelize'
import { EXAM_COUNT_CAP, type Exam, type ExamList, type ExamListQuery } from '#shared/schemas/exam'
import type { ReadFacts } from '../users/auth-state.ts'
import type { User } from '#shared/schemas/user'
import { AppError, invalidInput } from '../errors.ts'
import { ExamModel } from '../models/index.ts'
import { readable, scopeOf, type ExamScope } from './exam-access.ts'
import { present } from './exam-record.ts'
import { blindedEntryError } from '../rounds/round-blinding.ts'
import { cappedCount } from './exam-count.ts'
import { presentPage } from './exam-page.ts'
import type { PageCache } from './exam-caches.ts'
import { afterCursor, cursorAfter, decodeCursor, orderOf } from './exam-keyset.ts'

export interface Viewer {
  user: User
  mask: (patientCode: string) => string
  /** What the request read with the account (middleware/auth.ts `readFacts`): spares a cached read its own queries. */
  facts?: ReadFacts
}

const invalid = (field: string, message: string) => invalidInput({ [field]: message })

/** The exam log's filters, shared by the list and the CSV export; only the list sorts. */
export type ExamFilterQuery = Pick<ExamListQuery, 'status' | 'teamId' | 'examinerId' | 'patientCode' | 'from' | 'to'> &
  Partial<Pick<ExamListQuery, 'sort'>>

/** Masked rows must not be found, nor ordered, by their real code; a search by code stays within the clinical scope. */
function visibleWhere(scope: ExamScope, query: ExamFilterQuery): WhereOptions<ExamModel> {
  if (query.patientCode) {
    if (!scope.clinical) throw invalid('patientCode', 'Patient codes are masked for your role; search by team or examiner')
    return scope.clinical
  }
  if (query.sort === 'patientCode' && scope.program) throw invalid('sort', 'Patient codes are masked for your role; sort by another column')
  const where = readable(scope)
  if (!where) throw new AppError('forbidden', 403, 'Your role does not allow reading exams')
  return where
}

function filtersOf(query: ExamFilterQuery): WhereOptions<ExamModel>[] {
  if (query.from && query.to && new Date(query.from) > new Date(query.to)) throw invalid('to', 'The end of the range is before its start')
  return [
    query.status && { status: query.status },
    query.teamId && { teamId: query.teamId },
    query.examinerId && { examinerId: query.examinerId },
    query.patientCode && { patientCode: query.patientCode },
    query.from && { examinedAt: { [Op.gte]: new Date(query.from) } },
    query.to && { examinedAt: { [Op.lte]: new Date(query.to) } },
  ].filter((w) => !!w)
}

/** The rows of the exam log this reader may see under these filters (field errors for what their role may not ask). */
export function logWhere(scope: ExamScope, query: ExamFilterQuery): WhereOptions<ExamModel> {
  return { [Op.and]: [visibleWhere(scope, query), ...filtersOf(query)] }
}

/** The patient code as this reader sees it: real within their clinical scope, else the keyed pseudonym. */
export function codeFor(scope: ExamScope, viewer: Viewer) {
  return (row: ExamModel) => (scope.showsCode(row) ? row.patientCode : viewer.mask(row.patientCode))
}

/** The row if the user may read it, with the scope that says whether they see its patient code; else 404. */
export async function readableRow(user: User, id: string): Promise<{ row: ExamModel; scope: ExamScope }> {
  const scope = await scopeOf(user)
  const where = scope.roundPeers ? { [Op.or]: [readable(scope) ?? scope.roundPeers, scope.roundPeers] } : readable(scope)
  const row = where && (await ExamModel.findOne({ where: { [Op.and]: [{ id }, where] } }))
  if (!row) throw (await blindedEntryError(user, id, scope.unblinded ?? null)) ?? new AppError('exam-not-found', 404, 'No such exam')
  return { row, scope }
}

export async function getExam(viewer: Viewer, id: string): Promise<Exam> {
  const { row, scope } = await readableRow(viewer.user, id)
  const [exam] = await present([row], codeFor(scope, viewer))
  return exam!
}

const offsetTooDeep = () =>
  invalid('page', `Pages beyond the first ${EXAM_COUNT_CAP.toLocaleString('en')} exams are reached with the cursor of the page before`)

/** The page's place: after the cursor, or at a page number within the counted exams. */
async function pageStart(where: WhereOptions<ExamModel>, query: ExamListQuery) {
  if (query.cursor) {
    const cursor = decodeCursor(query.cursor, query.sort, query.order)
    return { where: { [Op.and]: [where, afterCursor(ExamModel.sequelize!, cursor)] }, offset: 0, total: cursor.t, capped: cursor.c }
  }
  const offset = (query.page - 1) * query.pageSize
  if (offset >= EXAM_COUNT_CAP) throw offsetTooDeep()
  return { where, offset, ...(await cappedCount(where)) }
}

/**
 * A page of the log. Counted once, on a page asked for by number; a cursor carries that count on, so deep pages cost
 * one index range each (keyset paging), and an exam added or changed meanwhile never shifts the pages after it.
 */
export async function listExams(viewer: Viewer, query: ExamListQuery, read?: { scope: ExamScope; cache: PageCache }): Promise<ExamList> {
  const scope = read?.scope ?? (await scopeOf(viewer.user))
  const start = await pageStart(logWhere(scope, query), query)
  const rows = await ExamModel.findAll({ where: start.where, order: orderOf(query), limit: query.pageSize + 1, offset: start.offset })
  const page = rows.slice(0, query.pageSize)
  const last = page.at(-1)
  const nextCursor = rows.length > query.pageSize && last ? cursorAfter(last, query, start.total, start.capped) : null
  const exams = await presentPage(page, codeFor(scope, viewer), read?.cache)
  return { exams, total: start.total, totalCapped: start.capped, page: query.page, pageSize: query.pageSize, nextCursor }
}

import { Op, type WhereOptions } from 'sequelize'
import type { Exam, ExamList, ExamListQuery } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { AppError, invalidInput } from '../errors.ts'
import { ExamModel } from '../models/index.ts'
import { readable, scopeOf, type ExamScope } from './exam-access.ts'
import { present } from './exam-record.ts'
import { blindedEntryError } from '../rounds/round-blinding.ts'

export interface Viewer {
  user: User
  mask: (patientCode: string) => string
}

const SORT_COLUMNS: Record<ExamListQuery['sort'], string> = {
  examinedAt: 'examinedAt',
  patientCode: 'patientCode',
  status: 'status',
  heightCm: 'verticalHeightCm',
  cvpCmH2O: 'cvpCmH2O',
  updatedAt: 'updatedAt',
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

export async function listExams(viewer: Viewer, query: ExamListQuery): Promise<ExamList> {
  const scope = await scopeOf(viewer.user)
  const { rows, count } = await ExamModel.findAndCountAll({
    where: logWhere(scope, query),
    order: [
      [SORT_COLUMNS[query.sort], query.order.toUpperCase()],
      ['id', 'ASC'],
    ],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  })
  return { exams: await present(rows, codeFor(scope, viewer)), total: count, page: query.page, pageSize: query.pageSize }
}

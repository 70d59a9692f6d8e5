import type { Exam, ExamListQuery } from '#shared/schemas/exam'
import { db } from './index'
import { LocalExamSchema } from './sync-schema'

type SortKey = ExamListQuery['sort']

const SORT_VALUE: Record<SortKey, (e: Exam) => string | number | null> = {
  examinedAt: (e) => e.examinedAt,
  patientCode: (e) => e.patientCode,
  status: (e) => e.status,
  heightCm: (e) => e.estimate.heightCm,
  cvpCmH2O: (e) => e.estimate.cvpCmH2O,
  updatedAt: (e) => e.updatedAt,
}

function matches(exam: Exam, q: ExamListQuery): boolean {
  const at = Date.parse(exam.examinedAt)
  return (
    (!q.status || exam.status === q.status) &&
    (!q.patientCode || exam.patientCode === q.patientCode) &&
    (!q.from || at >= Date.parse(q.from)) &&
    (!q.to || at <= Date.parse(q.to))
  )
}

function compare(a: string | number | null, b: string | number | null): number {
  if (a === b) return 0
  if (a === null) return 1
  if (b === null) return -1
  return a < b ? -1 : 1
}

/** The log's page from the copies kept on this device, for reading with no network: same filters, sort and paging. */
export async function listLocalExams(ownerId: string, q: ExamListQuery): Promise<{ exams: Exam[]; total: number }> {
  const rows = await db.exams.where('ownerId').equals(ownerId).toArray()
  const exams = rows.flatMap((row) => {
    const parsed = LocalExamSchema.safeParse(row)
    return parsed.success && matches(parsed.data, q) ? [parsed.data] : []
  })
  const value = SORT_VALUE[q.sort]
  const sign = q.order === 'asc' ? 1 : -1
  exams.sort((a, b) => sign * compare(value(a), value(b)))
  const start = (q.page - 1) * q.pageSize
  return { exams: exams.slice(start, start + q.pageSize), total: exams.length }
}

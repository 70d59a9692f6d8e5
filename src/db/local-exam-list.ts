import type { Exam, ExamListQuery } from '#shared/schemas/exam'
import { db } from './index'
import { outboxOf } from './outbox'
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
    (!q.teamId || exam.teamId === q.teamId) &&
    (!q.examinerId || exam.examinerId === q.examinerId) &&
    (!q.patientCode || exam.patientCode === q.patientCode) &&
    (!q.from || at >= Date.parse(q.from)) &&
    (!q.to || at <= Date.parse(q.to))
  )
}

/** Exams without the value (no height for an unseen column) go last whichever way the column is sorted. */
function compare(a: string | number | null, b: string | number | null, sign: number): number {
  if (a === b) return 0
  if (a === null) return 1
  if (b === null) return -1
  return a < b ? -sign : sign
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
  exams.sort((a, b) => compare(value(a), value(b), sign))
  const start = (q.page - 1) * q.pageSize
  return { exams: exams.slice(start, start + q.pageSize), total: exams.length }
}

/** `pending`: saved here, not yet on the server; `attention`: the server refused it or it is in conflict. */
export type UnsentState = 'pending' | 'attention'

/** The author's exams with changes still in the outbox, and whether any of those waits for the user. */
export async function unsentExams(authorId: string): Promise<Record<string, UnsentState>> {
  const states: Record<string, UnsentState> = {}
  for (const item of await outboxOf(authorId)) {
    if (states[item.examId] !== 'attention') states[item.examId] = item.state === 'pending' ? 'pending' : 'attention'
  }
  return states
}

/** The device's copies of one patient's exams, oldest first, for the timeline with no network. */
export async function localExamsOfPatient(ownerId: string, patientCode: string): Promise<Exam[]> {
  const rows = await db.exams.where('ownerId').equals(ownerId).toArray()
  const exams = rows.flatMap((row) => {
    const parsed = LocalExamSchema.safeParse(row)
    return parsed.success && parsed.data.patientCode === patientCode ? [parsed.data] : []
  })
  return exams.sort((a, b) => Date.parse(a.examinedAt) - Date.parse(b.examinedAt))
}

import type { Exam, ExamListQuery } from '#shared/schemas/exam'
import type { UnsentState } from '@/db/local-exam-list'

/** One page of the exam log as the phone's rows (ExamLogList) and the table (ExamLogTable) both show it. */
export interface ExamLogPage {
  exams: Exam[]
  total: number
  /** More exams match than `total`, which the server counts up to a cap: shown as "10,000+". */
  totalCapped?: boolean
  /** The server said there is a page after this one. */
  more?: boolean
  loading: boolean
  query: ExamListQuery
  filtered: boolean
  /** Exams with changes saved on this device that the server has not acknowledged. */
  unsent?: Record<string, UnsentState>
  /** The rows are the copies kept on this device. */
  fromDevice?: boolean
}

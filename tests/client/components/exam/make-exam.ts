import type { Exam } from '#shared/schemas/exam'

export { makeApiExam as makeExam } from '../../../../tests/shared/api-exam'

/** The list envelope of GET /api/exams around the given rows. */
export function makeExamList(exams: Exam[], total = exams.length) {
  return { exams, total, totalCapped: false, page: 1, pageSize: 25, nextCursor: null as string | null }
}

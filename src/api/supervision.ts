import { ExamHistorySchema } from '#shared/schemas/audit'
import { ExamListSchema, ExamSchema } from '#shared/schemas/exam'
import type { AmendInput, CountersignInput, ReturnInput } from '#shared/schemas/signature'
import {
  SignoffQueueCountSchema,
  SignoffQueueResidentsSchema,
  SignoffQueueSchema,
  type SignoffQueueQuery,
} from '#shared/schemas/signoff-queue'
import { api } from './client'

const examPath = (id: string, action: string) => `exams/${encodeURIComponent(id)}/${action}`

export function countersignExam(id: string, input: CountersignInput) {
  return api
    .post(examPath(id, 'countersign'), { json: input })
    .json()
    .then((body) => ExamSchema.parse(body))
}

export function returnExam(id: string, input: ReturnInput) {
  return api
    .post(examPath(id, 'return'), { json: input })
    .json()
    .then((body) => ExamSchema.parse(body))
}

export function amendExam(id: string, input: AmendInput = {}) {
  return api
    .post(examPath(id, 'amend'), { json: input })
    .json()
    .then((body) => ExamSchema.parse(body))
}

export function fetchExamHistory(id: string) {
  return api
    .get(examPath(id, 'history'))
    .json()
    .then((body) => ExamHistorySchema.parse(body).events)
}

export function fetchSignoffQueue(query: Partial<SignoffQueueQuery> = {}) {
  const searchParams = Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== '')) as Record<
    string,
    number | string
  >
  return api
    .get('signoff-queue', { searchParams })
    .json()
    .then((body) => SignoffQueueSchema.parse(body))
}

/** Each resident with exams waiting for the attending, and how many. */
export function fetchSignoffResidents() {
  return api
    .get('signoff-queue/residents')
    .json()
    .then((body) => SignoffQueueResidentsSchema.parse(body).residents)
}

export function fetchSignoffCount() {
  return api
    .get('signoff-queue/count')
    .json()
    .then((body) => SignoffQueueCountSchema.parse(body).count)
}

/** The author's exams that an attending sent back, newest change first. */
export function fetchReturnedExams(examinerId: string) {
  const searchParams = { status: 'returned', examinerId, sort: 'updatedAt', order: 'desc', pageSize: 50 }
  return api
    .get('exams', { searchParams })
    .json()
    .then((body) => ExamListSchema.parse(body).exams)
}

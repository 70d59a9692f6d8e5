import request from 'supertest'
import type { ExamInputRaw } from '#shared/schemas/exam'
import type { SyncChangeInput } from '#shared/schemas/sync'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { makeExamInput } from '../factories/exam.ts'

type App = Parameters<typeof request>[0]

/** `POST /api/sync/push` as the caller. */
export function push(app: App, auth: string, changes: SyncChangeInput[]) {
  return request(app).post('/api/sync/push').set('Authorization', auth).send({ changes })
}

/** `GET /api/sync/pull` as the caller. */
export function pull(app: App, auth: string, cursor?: number, limit?: number) {
  return request(app).get('/api/sync/pull').query({ cursor, limit }).set('Authorization', auth)
}

/** A change creating a new exam on the team. */
export function newExam(teamId: string, overrides: Partial<ExamInputRaw> = {}): SyncChangeInput {
  return { exam: makeExamInput({ teamId, ...overrides }), baseVersion: null }
}

/** How many rows and audit events the server holds for an exam. */
export async function storedCounts(examId: string) {
  return {
    rows: await ExamModel.count({ where: { id: examId } }),
    events: await AuditEventModel.count({ where: { entityId: examId } }),
  }
}

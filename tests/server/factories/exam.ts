import { randomUUID } from 'node:crypto'
import request from 'supertest'
import type { Exam, ExamInputRaw } from '#shared/schemas/exam'
import { WORKED_EXAMPLE_FINDINGS } from '../../../tests/shared/worked-example.ts'

type App = Parameters<typeof request>[0]

const HOUR_MS = 60 * 60 * 1000

/** The README's worked example (vertical h = 4 cm at 45°, ruler, incline-adjusted), an hour ago. */
export function makeExamInput(overrides: Partial<ExamInputRaw> & { teamId: string }): ExamInputRaw {
  return {
    id: randomUUID(),
    patientCode: 'SM-0142',
    examinedAt: new Date(Date.now() - HOUR_MS).toISOString(),
    ...WORKED_EXAMPLE_FINDINGS,
    notes: '',
    ...overrides,
  }
}

/** Records an exam through the API as the caller and answers the stored copy. */
export async function recordExam(app: App, auth: string, overrides: Partial<ExamInputRaw> & { teamId: string }): Promise<Exam> {
  const res = await request(app).post('/api/exams').set('Authorization', auth).send(makeExamInput(overrides))
  if (res.status !== 201) throw new Error(`recordExam: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body as Exam
}

/** Records an exam and submits it for countersignature. */
export async function recordSubmittedExam(app: App, auth: string, overrides: Partial<ExamInputRaw> & { teamId: string }): Promise<Exam> {
  const exam = await recordExam(app, auth, overrides)
  const res = await request(app).post(`/api/exams/${exam.id}/submit`).set('Authorization', auth).send({ baseVersion: exam.version })
  if (res.status !== 200) throw new Error(`recordSubmittedExam: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body as Exam
}

import request from 'supertest'
import type { ExamInputRaw } from '#shared/schemas/exam'
import { RoundDetailSchema, RoundResultsSchema, type RoundCreateInput } from '#shared/schemas/round'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { patientCodeMask } from '../../../server/exams/exam-access.ts'
import { makeCaller, makeTeam, TEST_SECRET } from '../helpers.ts'

type App = Parameters<typeof request>[0]
export type Caller = Awaited<ReturnType<typeof makeCaller>>

/** A ward with an educator, `examiners` residents (the last of them an attending when `withAttending`) and an outsider resident. */
export async function calibrationWard(examiners = 3, withAttending = false) {
  const ward = await makeTeam('Ward 7 North — Cardiology')
  const educator = await makeCaller({ roles: ['educator'], displayName: 'Dr Hana Okafor' })
  const people: Caller[] = []
  for (let i = 0; i < examiners; i++) {
    const attending = withAttending && i === examiners - 1
    people.push(await makeCaller({ roles: [attending ? 'attending' : 'resident'], teamIds: [ward.id], displayName: `Examiner ${i + 1}` }))
  }
  const outsider = await makeCaller({ roles: ['resident'], teamIds: [ward.id], displayName: 'Not in the round' })
  return { ward, educator, examiners: people, outsider }
}

export function createRoundAs(app: App, auth: string, body: Partial<RoundCreateInput> | Record<string, unknown>) {
  return request(app).post('/api/rounds').set('Authorization', auth).send(body)
}

/** Creates a round through the API and answers its detail. */
export async function openRound(app: App, educator: Caller, patientCodes: string[], examiners: Caller[], name = 'Calibration round') {
  const res = await createRoundAs(app, educator.auth, { name, patientCodes, examinerIds: examiners.map((e) => e.user.id) })
  if (res.status !== 201) throw new Error(`openRound: ${res.status} ${JSON.stringify(res.body)}`)
  return RoundDetailSchema.parse(res.body)
}

/** One examiner's submitted entry of the round: vertical h at 45°, ruler. */
export function recordEntry(app: App, examiner: Caller, teamId: string, roundId: string, patientCode: string, heightCm: number, more: Partial<ExamInputRaw> = {}) {
  return recordSubmittedExam(app, examiner.auth, { teamId, roundId, patientCode, heightCm, ...more })
}

/** A draft entry, not submitted. */
export function recordDraftEntry(app: App, examiner: Caller, teamId: string, roundId: string, patientCode: string, heightCm: number) {
  return recordExam(app, examiner.auth, { teamId, roundId, patientCode, heightCm })
}

/**
 * Records a whole matrix: rows are patient codes, columns examiners; null leaves that cell empty.
 */
export async function recordMatrix(app: App, examiners: Caller[], teamId: string, roundId: string, codes: string[], matrix: (number | null)[][]) {
  for (const [i, code] of codes.entries()) {
    for (const [j, examiner] of examiners.entries()) {
      const h = matrix[i]![j]
      if (h !== null && h !== undefined) await recordEntry(app, examiner, teamId, roundId, code, h)
    }
  }
}

export function closeRoundAs(app: App, auth: string, roundId: string) {
  return request(app).post(`/api/rounds/${roundId}/close`).set('Authorization', auth).send({})
}

export async function resultsAs(app: App, auth: string, roundId: string) {
  const res = await request(app).get(`/api/rounds/${roundId}/results`).set('Authorization', auth)
  return { res, results: res.status === 200 ? RoundResultsSchema.parse(res.body) : undefined }
}

export async function detailAs(app: App, auth: string, roundId: string) {
  const res = await request(app).get(`/api/rounds/${roundId}`).set('Authorization', auth)
  return { res, round: res.status === 200 ? RoundDetailSchema.parse(res.body) : undefined }
}

/** A patient code as anyone outside the round's examiners (its educator) sees it: the server's keyed pseudonym. */
export const pseudonym = patientCodeMask(TEST_SECRET)

export const codes = (n: number, base = 300) => Array.from({ length: n }, (_, i) => `SM-${String(base + i).padStart(4, '0')}`)

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import type { ExamInputRaw } from '#shared/schemas/exam'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { makeExamInput, recordExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const TEN_MINUTES_AHEAD = () => new Date(Date.now() + 10 * 60 * 1000).toISOString()

type Invalid = [description: string, field: string, change: (otherTeamId: string) => Partial<ExamInputRaw>]

// A PATCH cannot express these: the id is fixed and an absent field means "unchanged".
const CREATE_ONLY: Invalid[] = [
  ['the id is not a UUID', 'id', () => ({ id: 'exam-1' })],
  ['the inclination is missing', 'inclinationDeg', () => ({ inclinationDeg: undefined })],
]

const INVALID: Invalid[] = [
  ['the patient code holds a space (a name, perhaps)', 'patientCode', () => ({ patientCode: 'John Smith' })],
  ['the patient code is empty', 'patientCode', () => ({ patientCode: '  ' })],
  ['the patient code is 41 characters', 'patientCode', () => ({ patientCode: 'A'.repeat(41) })],
  ['the inclination is 91°', 'inclinationDeg', () => ({ inclinationDeg: 91 })],
  ['the inclination is −1°', 'inclinationDeg', () => ({ inclinationDeg: -1 })],
  ['the vein is not one of the four', 'vein', () => ({ vein: 'carotid' as never })],
  ['the column top is not a known state', 'columnTop', () => ({ columnTop: 'unknown' as never })],
  ['the height is 31 cm', 'heightCm', () => ({ heightCm: 31 })],
  ['the height is −11 cm', 'heightCm', () => ({ heightCm: -11 })],
  ['a seen column has no height', 'heightCm', () => ({ heightCm: null })],
  ['an along-neck reading has no distance', 'alongNeckCm', () => ({ heightMethod: 'along-neck', heightCm: null })],
  ['the exam time is 10 minutes in the future', 'examinedAt', () => ({ examinedAt: TEN_MINUTES_AHEAD() })],
  ['the exam time is not a date-time', 'examinedAt', () => ({ examinedAt: 'yesterday' })],
  ['the team is not one of the author’s', 'teamId', (otherTeamId) => ({ teamId: otherTeamId })],
  ['the notes are 2,001 characters', 'notes', () => ({ notes: 'x'.repeat(2001) })],
  ['a venous sign is unknown (older list form)', 'venousSigns', () => ({ venousSigns: ['bounding' as never] })],
  ['a venous sign is unknown', 'venousSigns', () => ({ venousSigns: { bounding: 'present' } as never })],
  ['a venous sign has no known state', 'venousSigns.not-palpable', () => ({ venousSigns: { 'not-palpable': 'maybe' as never } })],
  // "Not filled" only lying (nearly) flat (≤ 10°, product default): at 30° the column may simply sit below the clavicle.
  ['no column is recorded at 30°', 'columnTop', () => ({ columnTop: 'not-filled', heightCm: null, inclinationDeg: 30 })],
  // Below 30°, h = d·sin θ turns a small angle error into a large height error (product default threshold).
  ['a reading along the neck is at 20°', 'heightMethod', () => ({ heightMethod: 'along-neck', alongNeckCm: 6, heightCm: null, inclinationDeg: 20 })],
  ['a column not assessable has no reason', 'notAssessableReason', () => ({ columnTop: 'not-assessable', heightCm: null })],
  ['the reason "other" has no text', 'notAssessableText', () => ({ columnTop: 'not-assessable', heightCm: null, notAssessableReason: 'other' })],
  ['a context flag is unknown', 'context.0', () => ({ context: ['pregnant' as never] })],
  ['the abdominojugular rise is negative', 'abdominojugular.riseCm', () => ({ abdominojugular: { done: true, riseCm: -1 } })],
]

describe('POST /api/exams with an invalid field', () => {
  it.each([...CREATE_ONLY, ...INVALID])('when %s, answers 400 naming %s and stores nothing', async (_when, field, change) => {
    const [mine, other] = [await makeTeam(), await makeTeam()]
    const { auth } = await makeCaller({ teamIds: [mine.id] })

    const res = await request(app)
      .post('/api/exams')
      .set('Authorization', auth)
      .send(makeExamInput({ teamId: mine.id, ...change(other.id) }))

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid-input')
    expect(Object.keys(res.body.error.fields)).toEqual([field])
    expect(await ExamModel.count()).toBe(0)
    expect(await AuditEventModel.count()).toBe(0)
  })

  it('accepts an exam time up to 5 minutes ahead of the server clock (phones drift)', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    const examinedAt = new Date(Date.now() + 60 * 1000).toISOString()

    const res = await request(app).post('/api/exams').set('Authorization', auth).send(makeExamInput({ teamId: team.id, examinedAt }))

    expect(res.status).toBe(201)
  })
})

describe('PATCH /api/exams/:id with an invalid result', () => {
  it.each(INVALID)(
    'when %s, answers 400 naming %s and leaves the exam unchanged',
    async (_when, field, change) => {
      const [mine, other] = [await makeTeam(), await makeTeam()]
      const { auth } = await makeCaller({ teamIds: [mine.id] })
      const exam = await recordExam(app, auth, { teamId: mine.id })

      const res = await request(app)
        .patch(`/api/exams/${exam.id}`)
        .set('Authorization', auth)
        .send({ ...change(other.id), baseVersion: 1 })

      expect(res.status).toBe(400)
      expect(Object.keys(res.body.error.fields)).toEqual([field])
      const after = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', auth)
      expect(after.body).toEqual(exam)
      expect(await AuditEventModel.count({ where: { action: 'exam-update' } })).toBe(0)
    },
  )

  it('when the base version is missing, answers 400 naming baseVersion', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    const exam = await recordExam(app, auth, { teamId: team.id })

    const res = await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', auth).send({ heightCm: 5 })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['baseVersion'])
  })
})

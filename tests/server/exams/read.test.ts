import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamListSchema, type Exam } from '#shared/schemas/exam'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function list(auth: string, query: Record<string, string | number> = {}) {
  const res = await request(app).get('/api/exams').set('Authorization', auth).query(query)
  return { res, ids: res.status === 200 ? ExamListSchema.parse(res.body).exams.map((e) => e.id) : [] }
}

const ids = (...exams: Exam[]) => exams.map((e) => e.id)

describe('GET /api/exams/:id', () => {
  it('answers the author’s exam as it was stored', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    const exam = await recordExam(app, auth, { teamId: team.id, notes: 'Head turned 30° left' })

    const res = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', auth)

    expect(res.status).toBe(200)
    expect(res.body).toEqual(exam)
    expect(res.body.notes).toBe('Head turned 30° left')
  })

  it('answers 404 for an id that does not exist', async () => {
    const { auth } = await makeCaller()

    const res = await request(app).get('/api/exams/00000000-0000-4000-8000-000000000000').set('Authorization', auth)

    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('exam-not-found')
  })
})

describe('GET /api/exams', () => {
  it('answers the page, its size and the total', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    for (let i = 0; i < 3; i++) await recordExam(app, auth, { teamId: team.id })

    const { res } = await list(auth, { page: 2, pageSize: 2 })

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ total: 3, page: 2, pageSize: 2 })
    expect(res.body.exams).toHaveLength(1)
  })

  it('filters by status', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    const draft = await recordExam(app, auth, { teamId: team.id })
    const submitted = await recordSubmittedExam(app, auth, { teamId: team.id })

    const drafts = await list(auth, { status: 'draft' })
    const sent = await list(auth, { status: 'submitted' })

    expect(drafts.ids).toEqual(ids(draft))
    expect(sent.ids).toEqual(ids(submitted))
  })

  it('filters by team', async () => {
    const [ward, icu] = [await makeTeam(), await makeTeam()]
    const { auth } = await makeCaller({ teamIds: [ward.id, icu.id] })
    const onWard = await recordExam(app, auth, { teamId: ward.id })
    await recordExam(app, auth, { teamId: icu.id })

    const { ids: found } = await list(auth, { teamId: ward.id })

    expect(found).toEqual(ids(onWard))
  })

  it('filters by examiner', async () => {
    const team = await makeTeam()
    const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
    const resident = await makeCaller({ teamIds: [team.id] })
    const residents = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await recordExam(app, attending.auth, { teamId: team.id })

    const { ids: found } = await list(attending.auth, { examinerId: resident.user.id })

    expect(found).toEqual(ids(residents))
  })

  it('filters by exact patient code', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    const first = await recordExam(app, auth, { teamId: team.id, patientCode: 'SM-0142' })
    await recordExam(app, auth, { teamId: team.id, patientCode: 'SM-01420' })

    const { ids: found } = await list(auth, { patientCode: 'SM-0142' })

    expect(found).toEqual(ids(first))
  })

  it('filters by the exam time, both ends inclusive', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    await recordExam(app, auth, { teamId: team.id, examinedAt: '2026-11-01T08:00:00Z' })
    const inside = await recordExam(app, auth, { teamId: team.id, examinedAt: '2026-11-02T08:00:00Z' })
    const atEnd = await recordExam(app, auth, { teamId: team.id, examinedAt: '2026-11-03T09:00:00+01:00' })
    await recordExam(app, auth, { teamId: team.id, examinedAt: '2026-11-04T08:00:00Z' })

    const { ids: found } = await list(auth, { from: '2026-11-02T00:00:00Z', to: '2026-11-03T08:00:00Z', order: 'asc' })

    expect(found).toEqual(ids(inside, atEnd))
  })

  it('when the range ends before it starts, answers 400 naming to', async () => {
    const { auth } = await makeCaller()

    const { res } = await list(auth, { from: '2026-11-03T00:00:00Z', to: '2026-11-02T00:00:00Z' })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['to'])
  })

  it.each([
    ['status', { status: 'signed' }],
    ['sort', { sort: 'patientName' }],
    ['pageSize', { pageSize: 500 }],
    ['from', { from: 'last week' }],
  ])('when %s is not valid, answers 400 naming it', async (field, query) => {
    const { auth } = await makeCaller()

    const { res } = await list(auth, query)

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual([field])
  })

  it('sorts by the vertical height, either way, and by time newest first by default', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    const low = await recordExam(app, auth, { teamId: team.id, heightCm: -2, examinedAt: '2026-11-02T08:00:00Z' })
    const high = await recordExam(app, auth, { teamId: team.id, heightCm: 8, examinedAt: '2026-11-01T08:00:00Z' })
    // 10 cm along the neck at 30° is 5 cm vertically.
    const alongNeck = await recordExam(app, auth, {
      teamId: team.id,
      heightMethod: 'along-neck',
      heightCm: null,
      alongNeckCm: 10,
      inclinationDeg: 30,
      examinedAt: '2026-11-03T08:00:00Z',
    })

    const ascending = await list(auth, { sort: 'heightCm', order: 'asc' })
    const descending = await list(auth, { sort: 'heightCm', order: 'desc' })
    const byDefault = await list(auth)

    expect(ascending.ids).toEqual(ids(low, alongNeck, high))
    expect(descending.ids).toEqual(ids(high, alongNeck, low))
    expect(byDefault.ids).toEqual(ids(alongNeck, low, high))
  })

  it('sorts by the estimated CVP', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    // Same h = 4 cm: 9.0 cmH₂O with the fixed 5 cm offset, 13.7 with the Seth offset at 45°.
    const seth = await recordExam(app, auth, { teamId: team.id })
    const fixed = await recordExam(app, auth, { teamId: team.id, offsetModel: 'fixed-5cm' })

    const { ids: found } = await list(auth, { sort: 'cvpCmH2O', order: 'asc' })

    expect(found).toEqual(ids(fixed, seth))
  })
})

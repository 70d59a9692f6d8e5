import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema } from '#shared/schemas/exam'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { makeExamInput } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

describe('POST /api/exams', () => {
  it('stores a draft at version 1 authored by the signed-in user and answers 201 with the exam', async () => {
    const team = await makeTeam('Ward 7 North')
    const { user, auth } = await makeCaller({ displayName: 'Dr Sam Whitcombe', teamIds: [team.id] })
    const input = makeExamInput({ teamId: team.id })

    const res = await request(app).post('/api/exams').set('Authorization', auth).send(input)

    expect(res.status).toBe(201)
    expect(ExamSchema.parse(res.body)).toMatchObject({
      id: input.id,
      patientCode: 'SM-0142',
      examinerId: user.id,
      examinerName: 'Dr Sam Whitcombe',
      teamName: 'Ward 7 North',
      status: 'draft',
      version: 1,
      submittedAt: null,
    })
    expect(await ExamModel.count()).toBe(1)
  })

  it('ignores the author, status, version and estimate a client sends', async () => {
    const team = await makeTeam()
    const { user, auth } = await makeCaller({ teamIds: [team.id] })
    const other = await makeCaller({ teamIds: [team.id] })
    const forged = { examinerId: other.user.id, status: 'countersigned', version: 7, estimate: { cvpCmH2O: 99 } }

    const res = await request(app)
      .post('/api/exams')
      .set('Authorization', auth)
      .send({ ...makeExamInput({ teamId: team.id }), ...forged })

    expect(res.body).toMatchObject({ examinerId: user.id, status: 'draft', version: 1 })
    // Worked example with Seth 2002's offset (9.7 cm at 45°): h = 4 cm, ruler, incline-adjusted → 13.7 cmH₂O,
    // band 9.2–18.2.
    expect(res.body.estimate.cvpCmH2O).toBeCloseTo(13.7, 2)
    expect(res.body.estimate.bandCmH2O[0]).toBeCloseTo(9.2, 1)
    expect(res.body.estimate.bandCmH2O[1]).toBeCloseTo(18.2, 1)
    expect((await ExamModel.findByPk(res.body.id))!.cvpCmH2O).toBeCloseTo(13.7, 2)
  })

  it('when the same author sends the same exam again (an offline retry), answers 200 with the stored copy and stores it once', async () => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ teamIds: [team.id] })
    const input = makeExamInput({ teamId: team.id })
    const first = await request(app).post('/api/exams').set('Authorization', auth).send(input)

    const retry = await request(app)
      .post('/api/exams')
      .set('Authorization', auth)
      .send({ ...input, examinedAt: input.examinedAt!.replace('Z', '+00:00') })

    expect(retry.status).toBe(200)
    expect(retry.body).toEqual(first.body)
    expect(await ExamModel.count()).toBe(1)
    expect(await AuditEventModel.count({ where: { action: 'exam-create' } })).toBe(1)
  })

  it('when the id is taken by another exam, answers 409 id-taken and leaves the stored exam alone', async () => {
    const team = await makeTeam()
    const author = await makeCaller({ teamIds: [team.id] })
    const other = await makeCaller({ teamIds: [team.id] })
    const input = makeExamInput({ teamId: team.id })
    await request(app).post('/api/exams').set('Authorization', author.auth).send(input)

    const byOther = await request(app).post('/api/exams').set('Authorization', other.auth).send(input)
    const changed = await request(app).post('/api/exams').set('Authorization', author.auth).send({ ...input, heightCm: 6 })

    expect(byOther.status).toBe(409)
    expect(byOther.body.error.code).toBe('id-taken')
    expect(changed.status).toBe(409)
    expect(changed.body.error.code).toBe('id-taken')
    const stored = (await ExamModel.findByPk(input.id))!
    expect([stored.examinerId, stored.heightCm]).toEqual([author.user.id, 4])
  })

  it('writes an exam-create audit event naming the author and the recorded values', async () => {
    const team = await makeTeam()
    const { user, auth } = await makeCaller({ teamIds: [team.id] })
    const input = makeExamInput({ teamId: team.id })

    await request(app).post('/api/exams').set('Authorization', auth).send(input)

    const events = await AuditEventModel.findAll({ where: { action: 'exam-create', entityId: input.id } })
    expect(events).toHaveLength(1)
    expect(events[0]!.actorId).toBe(user.id)
    expect(JSON.parse(events[0]!.changes!)).toMatchObject({
      heightCm: { from: null, to: 4 },
      status: { from: null, to: 'draft' },
      version: { from: null, to: 1 },
    })
  })

  it.each([
    ['an educator', ['educator'] as const],
    ['an admin', ['admin'] as const],
  ])('answers 403 to %s, who does not record exams', async (_who, roles) => {
    const team = await makeTeam()
    const { auth } = await makeCaller({ roles: [...roles], teamIds: [team.id] })

    const res = await request(app).post('/api/exams').set('Authorization', auth).send(makeExamInput({ teamId: team.id }))

    expect(res.status).toBe(403)
    expect(await ExamModel.count()).toBe(0)
  })

  it('answers 401 without a session', async () => {
    const team = await makeTeam()

    const res = await request(app).post('/api/exams').send(makeExamInput({ teamId: team.id }))

    expect(res.status).toBe(401)
  })
})

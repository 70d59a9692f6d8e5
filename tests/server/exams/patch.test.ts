import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema } from '#shared/schemas/exam'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function residentWithExam() {
  const team = await makeTeam()
  const resident = await makeCaller({ teamIds: [team.id] })
  const exam = await recordExam(app, resident.auth, { teamId: team.id })
  return { team, resident, exam }
}

describe('PATCH /api/exams/:id', () => {
  it('merges the change, recomputes the estimate and bumps the version', async () => {
    const { resident, exam } = await residentWithExam()

    const res = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', resident.auth)
      .send({ heightCm: 2, notes: 'Repeat after 40 mg furosemide', baseVersion: 1 })

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ version: 2, heightCm: 2, notes: 'Repeat after 40 mg furosemide', vein: exam.vein })
    // h = 2 cm at 45°, Seth offset 9.7 cm → 11.7 cmH₂O.
    expect(res.body.estimate.cvpCmH2O).toBeCloseTo(11.7, 2)
    expect((await ExamModel.findByPk(exam.id))!.cvpCmH2O).toBeCloseTo(11.7, 2)
  })

  it('when only one waveform finding is sent, keeps the other waveform findings as stored', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    const exam = await recordExam(app, resident.auth, { teamId: team.id, waveform: { aWave: 'normal', vWave: 'large', yDescent: 'steep' } })

    const res = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', resident.auth)
      .send({ waveform: { aWave: 'cannon' }, baseVersion: 1 })

    expect(res.body.waveform).toEqual({ aWave: 'cannon', vWave: 'large', yDescent: 'steep' })
  })

  it('ignores an estimate, status or author the client sends with the change', async () => {
    const { resident, exam } = await residentWithExam()

    const res = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', resident.auth)
      .send({ heightCm: 5, estimate: { cvpCmH2O: 99 }, status: 'countersigned', examinerId: 'someone', baseVersion: 1 })

    expect(res.body).toMatchObject({ status: 'draft', examinerId: resident.user.id })
    expect(res.body.estimate.cvpCmH2O).toBeCloseTo(14.7, 2)
  })

  it('writes an exam-update audit event with the before and after of the changed fields only', async () => {
    const { resident, exam } = await residentWithExam()

    await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', resident.auth).send({ heightCm: 2, baseVersion: 1 })

    const [event] = await AuditEventModel.findAll({ where: { action: 'exam-update', entityId: exam.id } })
    expect(event!.actorId).toBe(resident.user.id)
    expect(Object.keys(JSON.parse(event!.changes!)).sort()).toEqual(['cvpCmH2O', 'heightCm', 'version'])
    expect(JSON.parse(event!.changes!).heightCm).toEqual({ from: 4, to: 2 })
  })

  it('when nothing changes, keeps the version and writes no audit event', async () => {
    const { resident, exam } = await residentWithExam()

    const res = await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', resident.auth).send({ heightCm: 4, baseVersion: 1 })

    expect(res.status).toBe(200)
    expect(res.body.version).toBe(1)
    expect(await AuditEventModel.count({ where: { action: 'exam-update' } })).toBe(0)
  })

  it('when the base version is stale, answers 409 stale-version with the server copy and keeps it', async () => {
    const { resident, exam } = await residentWithExam()
    const url = `/api/exams/${exam.id}`
    await request(app).patch(url).set('Authorization', resident.auth).send({ heightCm: 6, baseVersion: 1 })

    const res = await request(app).patch(url).set('Authorization', resident.auth).send({ heightCm: 2, baseVersion: 1 })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('stale-version')
    expect(ExamSchema.parse(res.body.exam)).toMatchObject({ id: exam.id, version: 2, heightCm: 6 })
    expect((await ExamModel.findByPk(exam.id))!.heightCm).toBe(6)
  })

  it('when the exam was submitted, answers 409 exam-locked with the server copy', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id })

    const res = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', resident.auth)
      .send({ heightCm: 2, baseVersion: exam.version })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('exam-locked')
    expect(res.body.exam).toMatchObject({ status: 'submitted', heightCm: 4 })
  })

  it('lets the author amend and resubmit an exam an attending returned', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await ExamModel.update({ status: 'returned', version: 3 }, { where: { id: exam.id } })
    const url = `/api/exams/${exam.id}`

    const amended = await request(app).patch(url).set('Authorization', resident.auth).send({ heightCm: 3, baseVersion: 3 })
    const resubmitted = await request(app).post(`${url}/submit`).set('Authorization', resident.auth).send({ baseVersion: 4 })

    expect(amended.body).toMatchObject({ status: 'returned', version: 4, heightCm: 3 })
    expect(resubmitted.body).toMatchObject({ status: 'submitted', version: 5 })
  })

  it('answers 403 to an attending of the team, who may read but not change the resident’s exam', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id })

    const res = await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', attending.auth).send({ heightCm: 2, baseVersion: 2 })

    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('not-author')
  })

  it('answers 404 to another resident, without saying the exam exists', async () => {
    const { team, exam } = await residentWithExam()
    const other = await makeCaller({ teamIds: [team.id] })

    const res = await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', other.auth).send({ heightCm: 2, baseVersion: 1 })

    expect(res.status).toBe(404)
    expect((await ExamModel.findByPk(exam.id))!.heightCm).toBe(4)
  })
})

describe('POST /api/exams/:id/submit', () => {
  it('sends a draft for countersignature with the server’s time and bumps the version', async () => {
    const { resident, exam } = await residentWithExam()

    const res = await request(app).post(`/api/exams/${exam.id}/submit`).set('Authorization', resident.auth).send({ baseVersion: 1 })

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ status: 'submitted', version: 2, submittedAt: expect.any(String) })
    const [event] = await AuditEventModel.findAll({ where: { action: 'exam-submit', entityId: exam.id } })
    expect(JSON.parse(event!.changes!)).toMatchObject({ status: { from: 'draft', to: 'submitted' }, version: { from: 1, to: 2 } })
  })

  it('accepts a submit without a base version', async () => {
    const { resident, exam } = await residentWithExam()

    const res = await request(app).post(`/api/exams/${exam.id}/submit`).set('Authorization', resident.auth)

    expect(res.status).toBe(200)
    expect(res.body.status).toBe('submitted')
  })

  it('when the base version is stale, answers 409 stale-version and leaves it a draft', async () => {
    const { resident, exam } = await residentWithExam()
    await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', resident.auth).send({ heightCm: 6, baseVersion: 1 })

    const res = await request(app).post(`/api/exams/${exam.id}/submit`).set('Authorization', resident.auth).send({ baseVersion: 1 })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('stale-version')
    expect(res.body.exam).toMatchObject({ status: 'draft', version: 2 })
  })

  it('when already submitted, answers 409 exam-locked', async () => {
    const { resident, exam } = await residentWithExam()
    const url = `/api/exams/${exam.id}/submit`
    await request(app).post(url).set('Authorization', resident.auth).send({ baseVersion: 1 })

    const res = await request(app).post(url).set('Authorization', resident.auth).send({ baseVersion: 2 })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('exam-locked')
    expect(await AuditEventModel.count({ where: { action: 'exam-submit' } })).toBe(1)
  })

  it('answers 404 to another resident', async () => {
    const { team, exam } = await residentWithExam()
    const other = await makeCaller({ teamIds: [team.id] })

    const res = await request(app).post(`/api/exams/${exam.id}/submit`).set('Authorization', other.auth).send({ baseVersion: 1 })

    expect(res.status).toBe(404)
    expect((await ExamModel.findByPk(exam.id))!.status).toBe('draft')
  })
})

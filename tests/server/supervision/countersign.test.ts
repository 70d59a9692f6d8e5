import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema } from '#shared/schemas/exam'
import { UserModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, eventsOf, makeWard, RE_EXAMINED, recordOf, SIGN } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function submittedOnWard() {
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })
  return { ...ward, exam }
}

describe('POST /api/exams/:id/countersign', () => {
  it('signs the submitted version with the signer’s name, the meaning and the server’s time, and locks it', async () => {
    const { attending, exam } = await submittedOnWard()
    const before = Date.now()

    const res = await act(app, attending.auth, exam, 'countersign', { ...RE_EXAMINED, signedAt: '2020-01-01T00:00:00Z' })

    const after = Date.now()
    expect(res.status).toBe(200)
    const signed = ExamSchema.parse(res.body)
    expect(signed).toMatchObject({ status: 'countersigned', version: exam.version })
    expect(signed.signatures).toHaveLength(1)
    const [signature] = signed.signatures!
    expect(signature).toMatchObject({
      signerId: attending.user.id,
      signerName: 'Dr Tomas Lindqvist',
      meaning: 'reviewed-re-examined',
      examVersion: exam.version,
      superseded: false,
      valid: true,
    })
    expect(new Date(signature!.signedAt).getTime()).toBeGreaterThanOrEqual(before - 1)
    expect(new Date(signature!.signedAt).getTime()).toBeLessThanOrEqual(after + 1)
  })

  it('keeps the printed name as it was at signing when the signer is renamed later', async () => {
    const { attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)

    await UserModel.update({ displayName: 'Prof Tomas Lindqvist' }, { where: { id: attending.user.id } })
    const res = await request(app).get(`/api/exams/${exam.id}/signatures`).set('Authorization', attending.auth)

    expect(res.body.signatures[0].signerName).toBe('Dr Tomas Lindqvist')
  })

  it('when the password is wrong, answers 401 signature-password, stores no signature and audits the failure', async () => {
    const { attending, exam } = await submittedOnWard()
    const { events, ...before } = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'countersign', { ...SIGN, password: 'not-my-password' })

    expect(res.status).toBe(401)
    expect(res.body.error.code).toBe('signature-password')
    const { events: eventsAfter, ...after } = await recordOf(exam.id)
    expect(after).toEqual(before)
    expect(eventsAfter).toBe(events + 1)
    expect(await eventsOf(exam.id, 'exam-countersign-failed')).toEqual([{ actorId: attending.user.id, changes: { reason: 'wrong-password' } }])
  })

  it('after five wrong passwords within 15 minutes, answers 429 without checking the password', async () => {
    const { attending, exam } = await submittedOnWard()
    for (let i = 0; i < 5; i++) await act(app, attending.auth, exam, 'countersign', { ...SIGN, password: `guess-${i}` })

    const res = await act(app, attending.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(429)
    expect(res.body.error.code).toBe('too-many-attempts')
    expect((await recordOf(exam.id)).signatures).toBe(0)
  })

  it.each([
    ['without a password', { meaning: 'reviewed-agree' }, 'password'],
    ['with an unknown meaning', { password: 'x', meaning: 'looks-fine' }, 'meaning'],
  ])('%s, answers 400 naming the field and signs nothing', async (_case, body, field) => {
    const { attending, exam } = await submittedOnWard()
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'countersign', body)

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual([field])
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 403 to a resident of the ward, and signs nothing', async () => {
    const { team, exam } = await submittedOnWard()
    const resident = await makeCaller({ teamIds: [team.id], withPassword: true })
    const before = await recordOf(exam.id)

    const res = await act(app, resident.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(403)
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 403 own-exam to an attending countersigning their own exam', async () => {
    const { team, attending } = await makeWard()
    const exam = await recordSubmittedExam(app, attending.auth, { teamId: team.id })
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('own-exam')
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('lets another attending of the ward countersign an attending’s exam', async () => {
    const { team, attending } = await makeWard()
    const colleague = await makeCaller({ roles: ['attending'], teamIds: [team.id], withPassword: true })
    const exam = await recordSubmittedExam(app, attending.auth, { teamId: team.id })

    const res = await act(app, colleague.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(200)
    expect(res.body.status).toBe('countersigned')
  })

  it('answers 404 to an attending of another ward, without saying the exam exists', async () => {
    const { exam } = await submittedOnWard()
    const elsewhere = await makeTeam('Acute Medical Unit')
    const stranger = await makeCaller({ roles: ['attending'], teamIds: [elsewhere.id], withPassword: true })
    const before = await recordOf(exam.id)

    const res = await act(app, stranger.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(404)
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 403 not-team-attending to an attending who reads the exam through its author but is not on its team', async () => {
    const { team, attending } = await makeWard()
    const amu = await makeTeam('Acute Medical Unit')
    const rotating = await makeCaller({ teamIds: [team.id, amu.id] })
    const exam = await recordSubmittedExam(app, rotating.auth, { teamId: amu.id })
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('not-team-attending')
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 404 when countersigning a draft, which attendings do not see, and signs nothing', async () => {
    const { team, resident, attending } = await makeWard()
    const draft = await recordExam(app, resident.auth, { teamId: team.id })
    const before = await recordOf(draft.id)

    const res = await act(app, attending.auth, draft, 'countersign', SIGN)

    expect(res.status).toBe(404)
    expect(await recordOf(draft.id)).toEqual(before)
  })

  it('answers 409 not-submitted when the exam was returned, with the server copy', async () => {
    const { attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'return', { comment: 'Measure from the sternal angle' })
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('not-submitted')
    expect(res.body.exam).toMatchObject({ id: exam.id, status: 'returned' })
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 409 not-submitted when the exam is already countersigned, keeping one signature', async () => {
    const { team, attending, exam } = await submittedOnWard()
    const colleague = await makeCaller({ roles: ['attending'], teamIds: [team.id], withPassword: true })
    await act(app, attending.auth, exam, 'countersign', SIGN)

    const res = await act(app, colleague.auth, exam, 'countersign', SIGN)

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('not-submitted')
    expect((await recordOf(exam.id)).signatures).toBe(1)
  })

  it('answers 409 stale-version when the signer’s copy is older than the exam', async () => {
    const { attending, exam } = await submittedOnWard()
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'countersign', { ...SIGN, baseVersion: exam.version - 1 })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('stale-version')
    expect(await recordOf(exam.id)).toEqual(before)
  })
})

describe('a countersigned exam is locked', () => {
  it('refuses a change with 409 exam-locked and keeps the signed content', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)
    const before = await recordOf(exam.id)

    const res = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', resident.auth)
      .send({ heightCm: 2, baseVersion: exam.version })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('exam-locked')
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('refuses a resubmission with 409 exam-locked', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)
    const before = await recordOf(exam.id)

    const res = await act(app, resident.auth, exam, 'submit')

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('exam-locked')
    expect(await recordOf(exam.id)).toEqual(before)
  })
})

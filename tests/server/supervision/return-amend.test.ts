import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema } from '#shared/schemas/exam'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, recordOf, RE_EXAMINED, SIGN } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function submittedOnWard() {
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })
  return { ...ward, exam }
}

const COMMENT = 'Measure from the sternal angle, not the clavicle'

describe('POST /api/exams/:id/return', () => {
  it('sends the exam back with the comment as a new version, which its author then reads', async () => {
    const { resident, attending, exam } = await submittedOnWard()

    const res = await act(app, attending.auth, exam, 'return', { comment: `  ${COMMENT} ` })
    const read = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', resident.auth)

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ status: 'returned', version: exam.version + 1, returnComment: COMMENT })
    expect(read.body).toMatchObject({ status: 'returned', returnComment: COMMENT })
  })

  it('shows an educator no return comment (free text can name any patient)', async () => {
    const { team, resident, attending } = await makeWard()
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0157' })
    await act(app, attending.auth, exam, 'return', { comment: 'Is SM-0157 on diuretics?' })
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', educator.auth)

    expect(res.status).toBe(200)
    expect(res.body.returnComment).toBeNull()
    expect(JSON.stringify(res.body)).not.toContain('SM-0157')
  })

  it.each([
    ['without a comment', {}],
    ['with a blank comment', { comment: '   ' }],
    ['with a comment over 2,000 characters', { comment: 'x'.repeat(2001) }],
  ])('%s, answers 400 on the comment field and leaves the exam submitted', async (_case, body) => {
    const { attending, exam } = await submittedOnWard()
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'return', body)

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['comment'])
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 403 to a resident, 403 own-exam to the author and 404 to an attending of another ward', async () => {
    const { team, attending } = await makeWard()
    const exam = await recordSubmittedExam(app, attending.auth, { teamId: team.id })
    const resident = await makeCaller({ teamIds: [team.id] })
    const stranger = await makeCaller({ roles: ['attending'], teamIds: [(await makeTeam('Medical ICU')).id] })
    const before = await recordOf(exam.id)

    const byResident = await act(app, resident.auth, exam, 'return', { comment: COMMENT })
    const byAuthor = await act(app, attending.auth, exam, 'return', { comment: COMMENT })
    const byStranger = await act(app, stranger.auth, exam, 'return', { comment: COMMENT })

    expect([byResident.status, byAuthor.status, byStranger.status]).toEqual([403, 403, 404])
    expect(byAuthor.body.error.code).toBe('own-exam')
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 409 not-submitted for a countersigned exam and keeps its signature current', async () => {
    const { attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'return', { comment: COMMENT })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('not-submitted')
    expect(await recordOf(exam.id)).toEqual(before)
  })
})

describe('POST /api/exams/:id/amend', () => {
  it('reopens a returned exam as a draft of a new version; resubmitting clears the comment', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    const returned = await act(app, attending.auth, exam, 'return', { comment: COMMENT })

    const amended = await act(app, resident.auth, exam, 'amend', { baseVersion: returned.body.version })
    const patched = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', resident.auth)
      .send({ heightCm: 3, baseVersion: amended.body.version })
    const resubmitted = await act(app, resident.auth, exam, 'submit', { baseVersion: patched.body.version })

    expect(amended.status).toBe(200)
    expect(amended.body).toMatchObject({ status: 'draft', version: returned.body.version + 1, returnComment: COMMENT })
    expect(resubmitted.body).toMatchObject({ status: 'submitted', heightCm: 3, returnComment: null })
  })

  it('reopens a countersigned exam as a new version and keeps the old signature as superseded', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)

    const res = await act(app, resident.auth, exam, 'amend')

    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ status: 'draft', version: exam.version + 1 })
    expect(res.body.signatures).toEqual([expect.objectContaining({ examVersion: exam.version, superseded: true, valid: true })])
    expect(res.body.signatures[0].supersededAt).toEqual(expect.any(String))
  })

  it('after amending, changing and resubmitting, a new countersignature binds the new version beside the superseded one', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)
    const amended = await act(app, resident.auth, exam, 'amend')
    const url = `/api/exams/${exam.id}`
    const change = { notes: 'Rechecked after diuresis', baseVersion: amended.body.version }
    await request(app).patch(url).set('Authorization', resident.auth).send(change)
    await act(app, resident.auth, exam, 'submit')

    const res = await act(app, attending.auth, exam, 'countersign', RE_EXAMINED)

    expect(res.status).toBe(200)
    const signatures = ExamSchema.parse(res.body).signatures!
    expect(signatures.map((s) => [s.examVersion, s.superseded, s.valid])).toEqual([
      [exam.version, true, true],
      [exam.version + 3, false, true],
    ])
  })

  it.each([
    ['a draft', false],
    ['a submitted exam', true],
  ])('answers 409 not-amendable for %s and changes nothing', async (_case, submitted) => {
    const { team, resident } = await makeWard()
    const exam = submitted
      ? await recordSubmittedExam(app, resident.auth, { teamId: team.id })
      : await recordExam(app, resident.auth, { teamId: team.id })
    const before = await recordOf(exam.id)

    const res = await act(app, resident.auth, exam, 'amend')

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('not-amendable')
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 403 not-author to the attending who signed it and 404 to another resident', async () => {
    const { team, attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)
    const other = await makeCaller({ teamIds: [team.id] })
    const before = await recordOf(exam.id)

    const byAttending = await act(app, attending.auth, exam, 'amend')
    const byOther = await act(app, other.auth, exam, 'amend')

    expect([byAttending.status, byOther.status]).toEqual([403, 404])
    expect(byAttending.body.error.code).toBe('not-author')
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('answers 409 stale-version when the author’s copy is older', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'return', { comment: COMMENT })
    const before = await recordOf(exam.id)

    const res = await act(app, resident.auth, exam, 'amend', { baseVersion: exam.version })

    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('stale-version')
    expect(await recordOf(exam.id)).toEqual(before)
  })
})

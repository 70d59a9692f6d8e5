import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { AgreementPairListSchema } from '#shared/schemas/agreement'
import { ExamSchema } from '#shared/schemas/exam'
import { ExamModel } from '../../../server/models/index.ts'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { act, makeWard, RE_EXAMINED, recordOf, SIGN } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function submittedOnWard(patientCode = 'SM-0301') {
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode })
  return { ...ward, exam }
}

describe('POST /api/exams/:id/countersign with reviewed-re-examined', () => {
  it('without the attending’s reading, responds 400 naming attendingReading and signs nothing', async () => {
    const { attending, exam } = await submittedOnWard()
    const before = await recordOf(exam.id)

    const res = await act(app, attending.auth, exam, 'countersign', { ...SIGN, meaning: 'reviewed-re-examined' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields.attendingReading).toMatch(/height and inclination/)
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('with feedback "other" but no text, responds 400 naming feedbackText', async () => {
    const { attending, exam } = await submittedOnWard()

    const res = await act(app, attending.auth, exam, 'countersign', { ...RE_EXAMINED, feedback: ['other'] })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('feedbackText')
  })

  it('with a reading time in the future, responds 400 naming attendingReading.examinedAt', async () => {
    const { attending, exam } = await submittedOnWard()
    const examinedAt = new Date(Date.now() + 60 * 60_000).toISOString()

    const res = await act(app, attending.auth, exam, 'countersign', {
      ...RE_EXAMINED,
      attendingReading: { ...RE_EXAMINED.attendingReading, examinedAt },
    })

    expect(res.status).toBe(400)
    expect(res.body.error.fields['attendingReading.examinedAt']).toMatch(/future/)
    expect((await recordOf(exam.id)).signatures).toBe(0)
  })

  it('stores the reading as the attending’s own exam of the same patient, with the difference and feedback on the signature', async () => {
    const { attending, exam, team } = await submittedOnWard()
    const feedback = ['position', 'read-peak-not-mean']

    const res = await act(app, attending.auth, exam, 'countersign', { ...RE_EXAMINED, feedback, feedbackText: 'Good light' })

    expect(res.status).toBe(200)
    const signature = ExamSchema.parse(res.body).signatures![0]!
    expect(signature).toMatchObject({ valid: true, feedback, feedbackText: 'Good light' })
    // Resident h = 4 cm, attending h = 6 cm, both at 45° on the same offset model: the difference is 4 − 6 = −2 cmH₂O.
    expect(signature.attendingReading).toMatchObject({ heightCm: 6, inclinationDeg: 45, differenceCmH2O: -2 })
    expect(signature.attendingReading!.examinedAt).toBe(new Date(signature.signedAt).toISOString())
    const reading = (await ExamModel.findByPk(signature.attendingReading!.examId))!
    expect(reading).toMatchObject({
      examinerId: attending.user.id,
      patientCode: 'SM-0301',
      teamId: team.id,
      vein: exam.vein,
      offsetModel: exam.offsetModel,
      columnTop: 'seen',
      heightMethod: 'vertical',
      readingPrecision: 'ruler',
      status: 'submitted',
    })
    expect(signature.attendingReading!.cvpCmH2O).toBe(reading.cvpCmH2O)
  })

  it('forms an agreement pair of the resident and the attending, listed by /api/agreement/pairs', async () => {
    const { attending, resident, exam } = await submittedOnWard('SM-0302')

    const signed = await act(app, attending.auth, exam, 'countersign', RE_EXAMINED)
    const res = await request(app).get('/api/agreement/pairs').set('Authorization', resident.auth)

    expect(res.status).toBe(200)
    const readingId = ExamSchema.parse(signed.body).signatures![0]!.attendingReading!.examId
    const [pair] = AgreementPairListSchema.parse(res.body).pairs
    expect(pair).toMatchObject({ patientCode: 'SM-0302', order: 'resident-minus-attending', differenceCm: -2 })
    expect([pair!.first.examId, pair!.second.examId]).toEqual([exam.id, readingId])
  })

  it('leaves the reading out of every sign-off queue and refuses to countersign it', async () => {
    const { attending, exam, team } = await submittedOnWard()
    const colleague = await makeCaller({ roles: ['attending'], teamIds: [team.id], withPassword: true })
    const signed = await act(app, attending.auth, exam, 'countersign', RE_EXAMINED)
    const reading = { id: ExamSchema.parse(signed.body).signatures![0]!.attendingReading!.examId }

    const queue = await request(app).get('/api/signoff-queue').set('Authorization', colleague.auth)
    const res = await act(app, colleague.auth, reading, 'countersign', SIGN)

    expect(queue.body.total).toBe(0)
    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('attending-reading')
  })
})

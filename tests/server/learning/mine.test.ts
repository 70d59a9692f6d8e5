import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { MyAgreementSchema } from '#shared/schemas/learning'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, RE_EXAMINED } from '../supervision/ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

type Ward = Awaited<ReturnType<typeof makeWard>>
const minutesAgo = (minutes: number) => new Date(Date.now() - minutes * 60_000).toISOString()

/** The resident and the attending each examine one patient 10 minutes apart, at 45°: their difference is h − h'. */
async function pair(ward: Ward, index: number, residentCm: number, attendingCm: number) {
  const teamId = ward.team.id
  const patientCode = `LC-${index}`
  const base = 24 * 60 - index * 60
  await recordSubmittedExam(app, ward.resident.auth, { teamId, patientCode, heightCm: residentCm, examinedAt: minutesAgo(base) })
  await recordSubmittedExam(app, ward.attending.auth, { teamId, patientCode, heightCm: attendingCm, examinedAt: minutesAgo(base - 10) })
}

function mine(auth: string, query = '') {
  return request(app).get(`/api/agreement/mine${query}`).set('Authorization', auth)
}

describe('GET /api/agreement/mine', () => {
  it('gives a resident their bias, mean |difference|, n and the learning curve by blocks of 10 cases, oldest first', async () => {
    const ward = await makeWard()
    // Cases 1–10 differ by +2 cm, case 11 by −1 cm (the resident's height minus the attending's).
    for (let i = 0; i < 10; i++) await pair(ward, i, 6, 4)
    await pair(ward, 10, 3, 4)

    const res = await mine(ward.resident.auth)

    expect(res.status).toBe(200)
    const body = MyAgreementSchema.parse(res.body)
    expect(body).toMatchObject({ residentId: ward.resident.user.id, name: 'Dr Sam Whitcombe', n: 11 })
    // bias (10 × 2 − 1) / 11 = 19/11; mean |d| (10 × 2 + 1) / 11 = 21/11.
    expect(body.bias).toBeCloseTo(19 / 11, 9)
    expect(body.meanAbsDifference).toBeCloseTo(21 / 11, 9)
    expect(body.curve).toEqual([
      { block: 1, fromCase: 1, toCase: 10, n: 10, meanAbsDifferenceCmH2O: expect.closeTo(2, 9) },
      { block: 2, fromCase: 11, toCase: 11, n: 1, meanAbsDifferenceCmH2O: expect.closeTo(1, 9) },
    ])
  })

  it('lists the feedback and the reading’s difference from each countersignature with them', async () => {
    const ward = await makeWard()
    const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'LC-FB' })
    await act(app, ward.attending.auth, exam, 'countersign', {
      ...RE_EXAMINED,
      feedback: ['wrong-reference-point'],
      feedbackText: 'Use the angle',
    })

    const body = MyAgreementSchema.parse((await mine(ward.resident.auth)).body)

    // Resident h = 4, attending h = 6 at 45°: −2 cmH₂O, and the reading pairs with the exam.
    expect(body.n).toBe(1)
    expect(body.bias).toBeCloseTo(-2, 9)
    expect(body.feedback).toEqual([
      {
        examId: exam.id,
        patientCode: 'LC-FB',
        signerName: 'Dr Tomas Lindqvist',
        signedAt: expect.any(String),
        codes: ['wrong-reference-point'],
        text: 'Use the angle',
        differenceCmH2O: -2,
      },
    ])
  })

  it('without pairs, gives n 0 and nulls', async () => {
    const ward = await makeWard()

    const body = MyAgreementSchema.parse((await mine(ward.resident.auth)).body)

    expect(body).toMatchObject({ n: 0, bias: null, meanAbsDifference: null, curve: [], feedback: [] })
  })

  it('lets an attending read a resident of their teams, and answers 404 for anyone else', async () => {
    const ward = await makeWard()
    await pair(ward, 0, 6, 4)
    const stranger = await makeCaller({ teamIds: [(await makeTeam()).id] })

    const own = await mine(ward.attending.auth, `?residentId=${ward.resident.user.id}`)
    const notTheirs = await mine(ward.attending.auth, `?residentId=${stranger.user.id}`)
    const residentAsksOther = await mine(stranger.auth, `?residentId=${ward.resident.user.id}`)

    expect(own.status).toBe(200)
    expect(own.body.n).toBe(1)
    expect([notTheirs.status, residentAsksOther.status]).toEqual([404, 404])
  })

  it('lets an educator read any resident, with patient codes as pseudonyms; an attending without a resident gets 400', async () => {
    const ward = await makeWard()
    const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'LC-ED' })
    await act(app, ward.attending.auth, exam, 'countersign', { ...RE_EXAMINED, feedback: ['position'] })
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await mine(educator.auth, `?residentId=${ward.resident.user.id}`)
    const noResident = await mine(ward.attending.auth)

    expect(res.status).toBe(200)
    expect(res.body.feedback[0].patientCode).toMatch(/^P-[0-9a-f]{8}$/)
    expect(noResident.status).toBe(400)
    expect(noResident.body.error.fields).toHaveProperty('residentId')
  })
})

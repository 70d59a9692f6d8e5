import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { EstimateSchema } from '#shared/schemas/exam'
import { ExamModel } from '../../../server/models/index.ts'
import { makeExamInput } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

describe('POST /api/estimate', () => {
  it('answers the estimate of the findings and stores nothing', async () => {
    const { auth } = await makeCaller()

    const res = await request(app).post('/api/estimate').set('Authorization', auth).send(makeExamInput({ teamId: 'any' }))

    expect(res.status).toBe(200)
    // The worked example: 13.7 cmH₂O = 10.08 mmHg, band 9.2–18.2: elevated (h > 3 cm, McGee 1998), the band
    // reaches "normal or high" (Cook 1990 categories), indeterminate.
    expect(EstimateSchema.parse(res.body)).toMatchObject({
      rulesVersion: 2,
      elevated: true,
      categories: ['normal', 'high'],
      confidence: 'indeterminate',
      bound: 'point',
    })
    expect(res.body.cvpCmH2O).toBeCloseTo(13.7, 2)
    expect(res.body.cvpMmHg).toBeCloseTo(10.08, 2)
    expect(await ExamModel.count()).toBe(0)
  })

  it('when the inclination is 91°, answers 400 naming inclinationDeg', async () => {
    const { auth } = await makeCaller()

    const res = await request(app)
      .post('/api/estimate')
      .set('Authorization', auth)
      .send(makeExamInput({ teamId: 'any', inclinationDeg: 91 }))

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['inclinationDeg'])
  })

  it('answers 403 to an admin and 401 without a session', async () => {
    const { auth } = await makeCaller({ roles: ['admin'] })
    const findings = makeExamInput({ teamId: 'any' })

    const admin = await request(app).post('/api/estimate').set('Authorization', auth).send(findings)
    const anonymous = await request(app).post('/api/estimate').send(findings)

    expect(admin.status).toBe(403)
    expect(anonymous.status).toBe(401)
  })
})

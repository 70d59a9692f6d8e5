import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { invalidateObserverTerm } from '../../../server/agreement/observer-term.ts'
import { makeExamInput } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, storeExam } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
  invalidateObserverTerm()
})

/** 30 resident–attending pairs whose differences alternate +1 and −1 cm: SD = √(30/29), σ_observer = SD/√2. */
async function storeThirtyPairs(teamId: string) {
  const resident = await makeCaller({ roles: ['resident'], teamIds: [teamId] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [teamId] })
  for (let i = 0; i < 30; i++) {
    const at = Date.now() - (i + 1) * DAY
    await storeExam({ teamId, patientCode: `SM-9${i}`, examinerId: resident.user.id, at, heightCm: i % 2 ? 3 : 5 })
    await storeExam({ teamId, patientCode: `SM-9${i}`, examinerId: attending.user.id, at: at + 30 * MINUTE, heightCm: 4 })
  }
}

describe('the estimate of a saved exam, once the deployment has local agreement data (§4.4)', () => {
  it('uses the local observer spread and says so', async () => {
    const team = await makeTeam()
    await storeThirtyPairs(team.id)
    const author = await makeCaller({ teamIds: [team.id] })

    const res = await request(app).post('/api/exams').set('Authorization', author.auth).send(makeExamInput({ teamId: team.id }))

    // Worked example h = 4 cm at 45°, ruler: σ = √(0.5² + 1.0² + σ_obs²) with σ_obs = √(30/29)/√2.
    const sigmaObserver = Math.sqrt(30 / 29) / Math.SQRT2
    expect(res.status).toBe(201)
    expect(res.body.estimate.observerSource).toBe('local')
    expect(res.body.estimate.sigmaCm).toBeCloseTo(Math.hypot(0.5, 1, sigmaObserver), 9)
  })

  it('without enough pairs keeps the default 2.0 cm and says so', async () => {
    const team = await makeTeam()
    const author = await makeCaller({ teamIds: [team.id] })

    const res = await request(app).post('/api/estimate').set('Authorization', author.auth).send(makeExamInput({ teamId: team.id }))

    expect(res.body.observerSource).toBe('default')
    expect(res.body.sigmaCm).toBeCloseTo(Math.hypot(0.5, 1, 2), 9)
  })
})

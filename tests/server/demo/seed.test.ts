import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { ExamListSchema } from '#shared/schemas/exam'
import { DEMO_PASSWORD, seedDemo } from '../../../server/demo/seed.ts'
import { AuditEventModel, ExamModel, MembershipModel, TeamModel, UserModel } from '../../../server/models/index.ts'
import { makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let first: Awaited<ReturnType<typeof seedDemo>>

const counts = () =>
  Promise.all([TeamModel.count(), UserModel.count(), MembershipModel.count(), ExamModel.count(), AuditEventModel.count()])

// Seeded once for the file: ten bcrypt hashes at the production cost take seconds.
beforeAll(async () => {
  ;({ app } = await makeTestApp({ demo: true }))
  first = await seedDemo()
})

async function signInAs(email: string) {
  const res = await request(app).post('/api/auth/login').send({ email, password: DEMO_PASSWORD })
  return { res, auth: `Bearer ${res.body.token as string}` }
}

describe('demo seed', () => {
  it('creates the three teams, the named accounts and a dozen exams once, and a second run changes nothing', async () => {
    const before = await counts()

    const second = await seedDemo()

    expect(first.created).toBeGreaterThanOrEqual(10)
    expect(first.exams).toBe(12)
    expect(second).toEqual({ created: 0, exams: 0 })
    expect(await counts()).toEqual(before)
    expect(before[0]).toBe(3)
  })

  it('lets the resident sign in with the demo password and puts them on the cardiology ward with the attending', async () => {
    const resident = await signInAs('resident@saltmarsh.test')
    const attending = await signInAs('attending@saltmarsh.test')

    expect(resident.res.status).toBe(200)
    expect(resident.res.body.user.teams).toEqual([expect.objectContaining({ name: 'Ward 7 North — Cardiology' })])
    expect(attending.res.body.user.teams).toEqual(resident.res.body.user.teams)
    expect(attending.res.body.user.roles).toEqual(['attending'])
  })

  it('gives the resident a log of drafts and submitted exams with plausible findings', async () => {
    const { auth } = await signInAs('resident@saltmarsh.test')

    const res = await request(app).get('/api/exams').set('Authorization', auth)

    const { exams } = ExamListSchema.parse(res.body)
    expect(exams.length).toBeGreaterThanOrEqual(8)
    expect(new Set(exams.map((e) => e.status))).toEqual(new Set(['draft', 'submitted']))
    expect(exams.every((e) => /^SM-\d{4}$/.test(e.patientCode) && e.examinerName === 'Dr Sam Whitcombe')).toBe(true)
    expect(exams.every((e) => e.inclinationDeg >= 30 && e.inclinationDeg <= 60)).toBe(true)
  })
})

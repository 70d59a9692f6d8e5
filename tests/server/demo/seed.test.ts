import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, seedDemo } from '../../../server/demo/seed.ts'
import { MembershipModel, TeamModel, UserModel } from '../../../server/models/index.ts'
import { makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp({ demo: true }))
})

describe('demo seed', () => {
  it('creates the three teams and the named accounts once, and a second run changes nothing', async () => {
    const first = await seedDemo()
    const counts = [await TeamModel.count(), await UserModel.count(), await MembershipModel.count()]

    const second = await seedDemo()

    expect(first.created).toBeGreaterThanOrEqual(10)
    expect(second.created).toBe(0)
    expect([await TeamModel.count(), await UserModel.count(), await MembershipModel.count()]).toEqual(counts)
    expect(counts[0]).toBe(3)
  })

  it('lets the resident sign in with the demo password and puts them on the cardiology ward with the attending', async () => {
    await seedDemo()

    const resident = await request(app).post('/api/auth/login').send({ email: 'resident@saltmarsh.test', password: DEMO_PASSWORD })
    const attending = await request(app).post('/api/auth/login').send({ email: 'attending@saltmarsh.test', password: DEMO_PASSWORD })

    expect(resident.status).toBe(200)
    expect(resident.body.user.teams).toEqual([expect.objectContaining({ name: 'Ward 7 North — Cardiology' })])
    expect(attending.body.user.teams).toEqual(resident.body.user.teams)
    expect(attending.body.user.roles).toEqual(['attending'])
  })
})

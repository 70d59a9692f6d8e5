import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { RoundListSchema, RoundResultsSchema } from '#shared/schemas/round'
import { seedDemo } from '../../../server/demo/seed.ts'
import { RoundModel } from '../../../server/models/index.ts'
import { makeTestApp } from '../helpers.ts'
import { signAccessToken } from '../../../server/auth/tokens.ts'
import { UserModel } from '../../../server/models/index.ts'
import { TEST_SECRET } from '../helpers.ts'
import { pseudonym } from './round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeAll(async () => {
  ;({ app } = await makeTestApp({ demo: true }))
  await seedDemo()
})

async function authOf(email: string) {
  const user = (await UserModel.findOne({ where: { email } }))!
  return `Bearer ${signAccessToken(TEST_SECRET, { sub: user.id, roles: user.roles })}`
}

describe('the demo’s calibration round', () => {
  it('is one closed round of 4 examiners × 6 patient codes with one entry missing, and reseeding adds nothing', async () => {
    const educator = await authOf('educator@saltmarsh.test')

    await seedDemo()
    const { rounds } = RoundListSchema.parse((await request(app).get('/api/rounds').set('Authorization', educator)).body)
    const results = RoundResultsSchema.parse((await request(app).get(`/api/rounds/${rounds[0]!.id}/results`).set('Authorization', educator)).body)

    expect(await RoundModel.count()).toBe(1)
    expect(rounds).toHaveLength(1)
    expect(rounds[0]).toMatchObject({ status: 'closed', expected: 24, recorded: 23 })
    expect(results.completeSubjects).toBe(5)
    expect(results.missing.entries).toEqual([expect.objectContaining({ examinerName: 'Dr Aiko Brennan', patientCode: pseudonym('SM-0316'), reason: 'not-recorded' })])
    expect('value' in results.icc).toBe(true)
    expect('value' in results.fleissElevated).toBe(true)
    // The residents read under the attending, so the attending's bias against the round mean is the highest.
    const byName = new Map(results.byExaminer.map((b) => [b.name, b.bias!]))
    expect(Math.max(...byName.values())).toBe(byName.get('Dr Tomas Lindqvist'))
  })

  it('the round’s examiners see it in their list; its entries do not join the supervision pairs', async () => {
    const resident = await authOf('resident3@saltmarsh.test')

    const { rounds } = RoundListSchema.parse((await request(app).get('/api/rounds').set('Authorization', resident)).body)

    expect(rounds.map((r) => r.name)).toEqual(['Ward 7 North calibration — November'])
  })
})

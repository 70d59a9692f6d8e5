import { beforeEach, describe, expect, it } from 'vitest'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { MINUTE, storeExam, trendAs } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

/** A ward's resident and attending; `pair` stores one patient's two exams, the resident's at `at`. */
async function ward(name = 'Ward 7 North') {
  const team = await makeTeam(name)
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  let patient = 0
  const pair = async (at: string, residentCm: number, attendingCm: number, attendingFirst = false) => {
    const common = { teamId: team.id, patientCode: `SM-${name.length}${String(++patient).padStart(3, '0')}` }
    const t = Date.parse(at)
    const [rAt, aAt] = attendingFirst ? [t + 30 * MINUTE, t] : [t, t + 30 * MINUTE]
    await storeExam({ ...common, examinerId: resident.user.id, at: rAt, heightCm: residentCm })
    await storeExam({ ...common, examinerId: attending.user.id, at: aAt, heightCm: attendingCm })
  }
  return { team, resident, attending, pair }
}

describe('GET /api/agreement/trend: bias and limits per month', () => {
  it('gives each UTC month its Bland–Altman figures, and lists a month without pairs as empty', async () => {
    const { pair } = await ward()
    await pair('2025-01-05T10:00:00Z', 3, 4) // −1
    await pair('2025-01-20T10:00:00Z', 2, 4) // −2
    await pair('2025-03-02T10:00:00Z', 5, 4.5) // +0.5
    const educator = await makeCaller({ roles: ['educator'] })

    const { res, trend } = await trendAs(app, educator.auth)

    expect(res.status).toBe(200)
    // January by hand with Bland & Altman 1986's formulas: bias −1.5, SD √0.5, limits −1.5 ∓ 1.96·√0.5.
    const sd = Math.sqrt(0.5)
    expect(trend!.months).toEqual([
      { month: '2025-01', n: 2, bias: -1.5, sd: expect.closeTo(sd, 10), loa: [expect.closeTo(-1.5 - 1.96 * sd, 10), expect.closeTo(-1.5 + 1.96 * sd, 10)] },
      { month: '2025-02', n: 0, bias: null, sd: null, loa: null },
      // One pair has a difference but no spread: never NaN.
      { month: '2025-03', n: 1, bias: 0.5, sd: null, loa: null },
    ])
  })

  it('files a pair under the UTC month of its earlier exam, taking resident − attending whoever came first', async () => {
    const { pair } = await ward()
    await pair('2025-01-31T23:45:00Z', 1, 3, true) // the attending at 23:45 on 31 Jan, the resident 30 minutes later
    await pair('2025-02-01T00:10:00Z', 4, 3)
    const educator = await makeCaller({ roles: ['educator'] })

    const { trend } = await trendAs(app, educator.auth)

    expect(trend!.months.map(({ month, n, bias }) => ({ month, n, bias }))).toEqual([
      { month: '2025-01', n: 1, bias: -2 },
      { month: '2025-02', n: 1, bias: 1 },
    ])
  })

  it('answers no months when no pair matches', async () => {
    const educator = await makeCaller({ roles: ['educator'] })

    const { trend } = await trendAs(app, educator.auth)

    expect(trend).toEqual({ months: [] })
  })

  it('takes the same filters and scope as the summary', async () => {
    const ward7 = await ward('Ward 7 North')
    const amu = await ward('Acute Medical Unit')
    await ward7.pair('2025-01-05T10:00:00Z', 3, 4)
    await ward7.pair('2025-02-05T10:00:00Z', 3, 4)
    await amu.pair('2025-01-06T10:00:00Z', 5, 4)
    const educator = await makeCaller({ roles: ['educator'] })

    const byTeam = (await trendAs(app, educator.auth, { teamId: amu.team.id })).trend!
    const byDate = (await trendAs(app, educator.auth, { from: '2025-02-01T00:00:00Z' })).trend!
    const asResident = (await trendAs(app, ward7.resident.auth)).trend!
    const otherResident = await trendAs(app, ward7.resident.auth, { examinerId: amu.resident.user.id })

    expect(byTeam.months).toEqual([{ month: '2025-01', n: 1, bias: 1, sd: null, loa: null }])
    expect(byDate.months.map((m) => [m.month, m.n])).toEqual([['2025-02', 1]])
    expect(asResident.months.map((m) => [m.month, m.n, m.bias])).toEqual([['2025-01', 1, -1], ['2025-02', 1, -1]])
    expect(otherResident.res.status).toBe(403)
  })

  it('refuses an unknown filter value with the field named, and anyone without an agreement role', async () => {
    const educator = await makeCaller({ roles: ['educator'] })
    const admin = await makeCaller({ roles: ['admin'] })

    const bad = await trendAs(app, educator.auth, { inclinationBand: 'steep' })
    const refused = await trendAs(app, admin.auth)

    expect(bad.res.status).toBe(400)
    expect(bad.res.body.error.fields).toHaveProperty('inclinationBand')
    expect(refused.res.status).toBe(403)
  })
})

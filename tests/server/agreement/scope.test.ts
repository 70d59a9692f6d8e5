import { beforeEach, describe, expect, it } from 'vitest'
import { patientCodeMask } from '../../../server/exams/exam-access.ts'
import { makeCaller, makeTeam, makeTestApp, TEST_SECRET } from '../helpers.ts'
import { DAY, MINUTE, pairsAs, storeExam, summaryAs } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 30 * DAY

/** Two wards, each with a resident–attending pair on its own patient. */
async function twoWards() {
  const [cardiology, amu] = [await makeTeam('Ward 7 North'), await makeTeam('Acute Medical Unit')]
  const resident = await makeCaller({ roles: ['resident'], teamIds: [cardiology.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [cardiology.id] })
  const amuResident = await makeCaller({ roles: ['resident'], teamIds: [amu.id] })
  const amuAttending = await makeCaller({ roles: ['attending'], teamIds: [amu.id] })
  const pair = async (a: typeof resident, b: typeof resident, teamId: string, patientCode: string) => {
    await storeExam({ examinerId: a.user.id, teamId, patientCode, at: T0 })
    await storeExam({ examinerId: b.user.id, teamId, patientCode, at: T0 + 30 * MINUTE })
  }
  await pair(resident, attending, cardiology.id, 'SM-0142')
  await pair(amuResident, amuAttending, amu.id, 'SM-0204')
  return { cardiology, amu, resident, attending, amuResident, amuAttending }
}

const codes = (list: Awaited<ReturnType<typeof pairsAs>>['list']) => list!.pairs.map((p) => p.patientCode).sort()

describe('who may ask about which pairs', () => {
  it('a resident sees only the pairs they took part in, with the real patient code', async () => {
    const { resident } = await twoWards()

    const { list } = await pairsAs(app, resident.auth)
    const { summary } = await summaryAs(app, resident.auth)

    expect(codes(list)).toEqual(['SM-0142'])
    expect(summary!.n).toBe(1)
    expect(summary!.byExaminer.map((e) => e.examinerId)).toEqual([resident.user.id])
  })

  it('a resident asking about another examiner gets 403', async () => {
    const { resident, amuResident } = await twoWards()

    const summary = await summaryAs(app, resident.auth, { examinerId: amuResident.user.id })
    const pairs = await pairsAs(app, resident.auth, { examinerId: amuResident.user.id })

    expect(summary.res.status).toBe(403)
    expect(pairs.res.status).toBe(403)
  })

  it('a resident may name themselves', async () => {
    const { resident } = await twoWards()

    const { res, summary } = await summaryAs(app, resident.auth, { examinerId: resident.user.id })

    expect(res.status).toBe(200)
    expect(summary!.n).toBe(1)
  })

  it('an attending sees the pairs involving members of their teams, not other wards’', async () => {
    const { attending } = await twoWards()

    const { list } = await pairsAs(app, attending.auth)

    expect(codes(list)).toEqual(['SM-0142'])
  })

  it('an attending sees a pair their team’s resident made with an examiner from another ward', async () => {
    const { amu, resident, amuAttending, attending } = await twoWards()
    await storeExam({ examinerId: resident.user.id, teamId: amu.id, patientCode: 'SM-0300', at: T0 + DAY })
    await storeExam({ examinerId: amuAttending.user.id, teamId: amu.id, patientCode: 'SM-0300', at: T0 + DAY + 20 * MINUTE })

    const { list } = await pairsAs(app, attending.auth)

    expect(codes(list)).toEqual(['SM-0142', 'SM-0300'])
  })

  it('an educator sees the whole program with patient codes masked as in the exam lists', async () => {
    await twoWards()
    const educator = await makeCaller({ roles: ['educator'] })
    const mask = patientCodeMask(TEST_SECRET)

    const { list } = await pairsAs(app, educator.auth)
    const { summary } = await summaryAs(app, educator.auth)

    expect(codes(list)).toEqual([mask('SM-0142'), mask('SM-0204')].sort())
    expect(JSON.stringify(list)).not.toContain('SM-0')
    expect(summary!.n).toBe(2)
  })

  it('an admin gets 403', async () => {
    await twoWards()
    const admin = await makeCaller({ roles: ['admin'] })

    const summary = await summaryAs(app, admin.auth)
    const pairs = await pairsAs(app, admin.auth)

    expect(summary.res.status).toBe(403)
    expect(pairs.res.status).toBe(403)
  })

  it('without a session, answers 401', async () => {
    const summary = await summaryAs(app, '')

    expect(summary.res.status).toBe(401)
  })
})

describe('GET /api/agreement/summary: filters', () => {
  it('narrows to a team, an examiner and a time range', async () => {
    const { amu, amuResident } = await twoWards()
    const educator = await makeCaller({ roles: ['educator'] })
    const after = new Date(T0 + 1).toISOString()

    const byTeam = await summaryAs(app, educator.auth, { teamId: amu.id })
    const byExaminer = await summaryAs(app, educator.auth, { examinerId: amuResident.user.id })
    const byTime = await summaryAs(app, educator.auth, { from: after })

    expect(byTeam.summary!.n).toBe(1)
    expect(byExaminer.summary!.byExaminer.map((e) => e.examinerId)).toEqual([amuResident.user.id])
    expect(byTime.summary!.n).toBe(0)
  })

  it('answers 400 when the range ends before it starts', async () => {
    const educator = await makeCaller({ roles: ['educator'] })

    const { res } = await summaryAs(app, educator.auth, { from: '2026-03-02T00:00:00Z', to: '2026-03-01T00:00:00Z' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('to')
  })
})

import { beforeEach, describe, expect, it } from 'vitest'
import type { Vein } from '#shared/schemas/exam'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, pairsAs, storeExam, summaryAs } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 30 * DAY

interface PairSpec {
  patientCode: string
  inclination: [resident: number, attending: number]
  vein?: [resident: Vein, attending: Vein]
  teamId?: string
}

/** A resident and an attending of one ward examine each patient 30 minutes apart, at the given postures and veins. */
async function ward(specs: PairSpec[]) {
  const team = await makeTeam('Ward 7 North')
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  for (const [i, spec] of specs.entries()) {
    const [rVein, aVein] = spec.vein ?? ['right-internal', 'right-internal']
    const common = { teamId: spec.teamId ?? team.id, patientCode: spec.patientCode }
    const at = T0 + i * DAY
    await storeExam({ ...common, examinerId: resident.user.id, at, findings: { inclinationDeg: spec.inclination[0], vein: rVein } })
    await storeExam({ ...common, examinerId: attending.user.id, at: at + 30 * MINUTE, findings: { inclinationDeg: spec.inclination[1], vein: aVein } })
  }
  return { team, resident, attending, educator: await makeCaller({ roles: ['educator'] }) }
}

async function codesFor(auth: string, query: Record<string, string>) {
  const { res, list } = await pairsAs(app, auth, query)
  expect(res.status).toBe(200)
  return list!.pairs.map((p) => p.patientCode).sort()
}

describe('GET /api/agreement/summary and /pairs: the inclination band filter', () => {
  it('puts each pair in the band of its mean inclination, on half-open bands [0, 30), [30, 60), [60, 90]', async () => {
    const { resident } = await ward([
      { patientCode: 'SM-0001', inclination: [0, 0] },
      { patientCode: 'SM-0002', inclination: [29, 30] }, // mean 29.5: still below 30
      { patientCode: 'SM-0003', inclination: [25, 35] }, // mean 30: the lower edge of the middle band
      { patientCode: 'SM-0004', inclination: [45, 45] },
      { patientCode: 'SM-0005', inclination: [59, 61] }, // mean 60: the lower edge of the top band
      { patientCode: 'SM-0006', inclination: [90, 90] },
    ])

    const low = await codesFor(resident.auth, { inclinationBand: '0-29' })
    const middle = await codesFor(resident.auth, { inclinationBand: '30-59' })
    const high = await codesFor(resident.auth, { inclinationBand: '60-90' })

    expect(low).toEqual(['SM-0001', 'SM-0002'])
    expect(middle).toEqual(['SM-0003', 'SM-0004'])
    expect(high).toEqual(['SM-0005', 'SM-0006'])
  })

  it('narrows the summary the same way, so the bands add up to the whole', async () => {
    const { educator } = await ward([
      { patientCode: 'SM-0001', inclination: [10, 20] },
      { patientCode: 'SM-0002', inclination: [30, 30] },
      { patientCode: 'SM-0003', inclination: [40, 50] },
      { patientCode: 'SM-0004', inclination: [70, 80] },
    ])

    const counts = []
    for (const inclinationBand of ['0-29', '30-59', '60-90']) counts.push((await summaryAs(app, educator.auth, { inclinationBand })).summary!.n)
    const all = (await summaryAs(app, educator.auth)).summary!.n

    expect(counts).toEqual([1, 2, 1])
    expect(all).toBe(4)
  })

  it('refuses a band it does not know, naming the field', async () => {
    const { educator } = await ward([{ patientCode: 'SM-0001', inclination: [45, 45] }])

    const { res } = await summaryAs(app, educator.auth, { inclinationBand: '45' })
    const pairs = await pairsAs(app, educator.auth, { inclinationBand: '0-30' })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['inclinationBand'])
    expect(pairs.res.status).toBe(400)
    expect(Object.keys(pairs.res.body.error.fields)).toEqual(['inclinationBand'])
  })
})

describe('GET /api/agreement/summary and /pairs: the vein filter', () => {
  const veins = () =>
    ward([
      { patientCode: 'SM-0001', inclination: [45, 45], vein: ['right-internal', 'right-internal'] },
      { patientCode: 'SM-0002', inclination: [45, 45], vein: ['left-internal', 'right-internal'] },
      { patientCode: 'SM-0003', inclination: [45, 45], vein: ['right-external', 'right-external'] },
      { patientCode: 'SM-0004', inclination: [45, 45], vein: ['right-internal', 'right-external'] },
    ])

  it('keeps a pair only when both of its exams were read on that vein', async () => {
    const { resident } = await veins()

    const rightInternal = await codesFor(resident.auth, { vein: 'right-internal' })
    const rightExternal = await codesFor(resident.auth, { vein: 'right-external' })
    const leftExternal = await codesFor(resident.auth, { vein: 'left-external' })

    expect(rightInternal).toEqual(['SM-0001'])
    expect(rightExternal).toEqual(['SM-0003'])
    expect(leftExternal).toEqual([])
  })

  it('"internal" and "external" take either side, and a mixed internal/external pair falls under neither', async () => {
    const { resident } = await veins()

    const internal = await codesFor(resident.auth, { vein: 'internal' })
    const external = await codesFor(resident.auth, { vein: 'external' })
    const { summary } = await summaryAs(app, resident.auth, { vein: 'internal' })

    expect(internal).toEqual(['SM-0001', 'SM-0002'])
    expect(external).toEqual(['SM-0003'])
    expect(summary!.n).toBe(2)
  })

  it('combines with the team and band filters', async () => {
    const otherTeam = await makeTeam('Acute Medical Unit')
    const { educator, team } = await ward([
      { patientCode: 'SM-0001', inclination: [45, 45], vein: ['right-internal', 'right-internal'] },
      { patientCode: 'SM-0002', inclination: [10, 10], vein: ['right-internal', 'right-internal'] },
      { patientCode: 'SM-0003', inclination: [45, 45], vein: ['right-internal', 'right-internal'], teamId: otherTeam.id },
      { patientCode: 'SM-0004', inclination: [45, 45], vein: ['left-external', 'left-external'] },
    ])

    const { summary } = await summaryAs(app, educator.auth, { teamId: team.id, inclinationBand: '30-59', vein: 'internal' })
    const { list } = await pairsAs(app, educator.auth, { teamId: team.id, inclinationBand: '30-59', vein: 'internal' })

    expect(summary!.n).toBe(1)
    expect(list!.total).toBe(1)
    expect(list!.pairs[0]!.first).toMatchObject({ inclinationDeg: 45, vein: 'right-internal', teamId: team.id })
  })

  it('refuses a vein the exam record does not name', async () => {
    const { educator } = await veins()

    const { res } = await summaryAs(app, educator.auth, { vein: 'femoral' })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['vein'])
  })
})

import { beforeEach, describe, expect, it } from 'vitest'
import { BlandAltmanSummarySchema } from '#shared/schemas/agreement'
import { blandAltman, cohenKappa, iccOneWay } from '#shared/stats/index'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, storeExam, summaryAs } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 60 * DAY
const close = (value: number) => expect.closeTo(value, 9)

/**
 * 24 patients, each read by one of four examiner pairs in turn: resident then attending, attending then resident (the
 * difference turns round), two residents, two attendings; heights spread over −2 to 8 cm in half centimetres.
 */
async function mixedPairs() {
  const team = await makeTeam()
  const caller = (roles: ('resident' | 'attending')[], displayName: string) => makeCaller({ roles, teamIds: [team.id], displayName })
  const [r1, r2] = [await caller(['resident'], 'Dr Ada Rees'), await caller(['resident'], 'Dr Ben Ortiz')]
  const [a1, a2] = [await caller(['attending'], 'Dr Cleo Marsh'), await caller(['attending'], 'Dr Dev Patel')]
  const turns = [[r1, a1], [a2, r2], [r1, r2], [a1, a2]] as const
  const pairs: { first: string; second: string; firstCm: number; secondCm: number }[] = []
  for (let i = 0; i < 24; i++) {
    const [earlier, later] = turns[i % 4]!
    const [earlierCm, laterCm] = [((i * 7) % 21) / 2 - 2, ((i * 11 + 3) % 21) / 2 - 2]
    const common = { teamId: team.id, patientCode: `SM-${2000 + i}` }
    await storeExam({ ...common, examinerId: earlier.user.id, at: T0 + i * DAY, heightCm: earlierCm })
    await storeExam({ ...common, examinerId: later.user.id, at: T0 + i * DAY + 20 * MINUTE, heightCm: laterCm })
    const turned = i % 4 === 1
    const [first, second] = turned ? [later, earlier] : [earlier, later]
    pairs.push({ first: first.user.id, second: second.user.id, firstCm: turned ? laterCm : earlierCm, secondCm: turned ? earlierCm : laterCm })
  }
  return { pairs, examinerIds: [r1, r2, a1, a2].map((c) => c.user.id), educator: await makeCaller({ roles: ['educator'] }) }
}

describe('GET /api/agreement/summary: figures from the database’s sums', () => {
  it('equal the per-pair functions over the same pairs, each in the difference’s order', async () => {
    const { pairs, educator } = await mixedPairs()
    const [first, second] = [pairs.map((p) => p.firstCm), pairs.map((p) => p.secondCm)]

    const { summary } = await summaryAs(app, educator.auth)

    const perPair = blandAltman(first, second)
    const icc = iccOneWay(pairs.map((p) => [p.firstCm, p.secondCm]))
    if (!perPair.ok || !icc.ok) throw new Error('the test data must give figures')
    const ba = BlandAltmanSummarySchema.parse(summary!.blandAltman)
    expect(ba.bias).toBeCloseTo(perPair.bias, 9)
    expect(ba.sd).toBeCloseTo(perPair.sd, 9)
    expect([...ba.loa, ...ba.biasCi, ...ba.loaCi.lower, ...ba.loaCi.upper]).toEqual(
      [...perPair.loa, ...perPair.biasCi, ...perPair.loaCi.lower, ...perPair.loaCi.upper].map(close),
    )
    expect(summary!.icc).toEqual({ value: close(icc.value), ci: icc.ci.map(close) })
    // Elevated: h > 3 cm (McGee 1998, Am Heart J 136:10–18), rows the first reading's.
    const table = [[0, 0], [0, 0]]
    for (const p of pairs) table[Number(p.firstCm > 3)]![Number(p.secondCm > 3)]! += 1
    const kappa = cohenKappa(table)
    expect(summary!.kappaElevated).toMatchObject({ value: close(kappa.ok ? kappa.value : NaN) })
  })

  it('give each examiner the per-pair bias and limits of their own reading against their partners’', async () => {
    const { pairs, examinerIds, educator } = await mixedPairs()

    const { summary } = await summaryAs(app, educator.auth)

    for (const id of examinerIds) {
      const own = pairs.flatMap((p) => (p.first === id ? [[p.firstCm, p.secondCm]] : p.second === id ? [[p.secondCm, p.firstCm]] : []))
      const r = blandAltman(own.map((o) => o[0]!), own.map((o) => o[1]!))
      if (!r.ok) throw new Error('each examiner has pairs enough')
      const row = summary!.byExaminer.find((e) => e.examinerId === id)
      expect(row).toMatchObject({ n: own.length, bias: close(r.bias), sd: close(r.sd), loa: r.loa.map(close) })
    }
  })
})

import { beforeEach, describe, expect, it } from 'vitest'
import { BlandAltmanSummarySchema } from '#shared/schemas/agreement'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, summaryAs, storeExam } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 30 * DAY

/** One resident and one attending examine each patient at 30° (offset 8.0 cm, Seth 2002), the resident first. */
async function pairsOf(heights: [resident: number, attending: number][]) {
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id], displayName: 'Dr Sam Whitcombe' })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id], displayName: 'Dr Tomas Lindqvist' })
  for (const [i, [r, a]] of heights.entries()) {
    const common = { teamId: team.id, patientCode: `SM-${1000 + i}`, findings: { inclinationDeg: 30 } }
    await storeExam({ ...common, examinerId: resident.user.id, at: T0 + i * DAY, heightCm: r })
    await storeExam({ ...common, examinerId: attending.user.id, at: T0 + i * DAY + 30 * MINUTE, heightCm: a })
  }
  return { resident, attending, educator: await makeCaller({ roles: ['educator'] }) }
}

describe('GET /api/agreement/summary: the statistics', () => {
  it('matches a hand-computed set of five pairs', async () => {
    // Differences −1, −1, −2, 0, 0: bias −0.8, SD √0.7; t(0.975, 4) = 2.7764451 (Bland & Altman 1986 formulas).
    // ICC(1,1), one-way ANOVA (Shrout & Fleiss 1979, case 1: each patient has its own pair of examiners):
    // MSR 26.85, MSW 0.6 → 26.25 / 27.45; F = 44.75 on (4, 5) df, F.975(4, 5) = 7.3879 and F.975(5, 4) = 9.3645
    // (F table) → 95% CI [(F/7.3879 − 1)/(F/7.3879 + 1), (9.3645F − 1)/(9.3645F + 1)] = [0.7166, 0.9952].
    // Elevated (h > 3 cm, McGee 1998) table [[3, 1], [0, 1]] → κ 0.24 / 0.44. Categories at CVP = h + 8 (Cook 1990):
    // [[0, 1, 0], [0, 2, 0], [0, 0, 2]] → linear 1 − 0.1/0.34, quadratic 1 − 0.05/0.21.
    const { educator } = await pairsOf([[-4, -3], [1, 2], [3, 5], [6, 6], [0, 0]])

    const { summary } = await summaryAs(app, educator.auth)

    const ba = BlandAltmanSummarySchema.parse(summary!.blandAltman)
    expect(summary!.n).toBe(5)
    expect(ba.bias).toBeCloseTo(-0.8, 10)
    expect(ba.sd).toBeCloseTo(Math.sqrt(0.7), 10)
    expect(ba.loa[0]).toBeCloseTo(-2.439854, 5)
    expect(ba.loa[1]).toBeCloseTo(0.839854, 5)
    expect(ba.biasCi[0]).toBeCloseTo(-1.838851, 5)
    expect(ba.biasCi[1]).toBeCloseTo(0.238851, 5)
    expect(ba.loaCi.lower[0]).toBeCloseTo(-4.239196, 5)
    expect(ba.loaCi.lower[1]).toBeCloseTo(-0.640512, 5)
    expect(summary!.icc).toEqual({ value: expect.closeTo(26.25 / 27.45, 10), ci: [expect.closeTo(0.7166, 3), expect.closeTo(0.9952, 3)] })
    expect(summary!.kappaElevated).toEqual({ value: expect.closeTo(0.24 / 0.44, 10), label: 'moderate' })
    expect(summary!.kappaCategory).toEqual({
      linear: expect.closeTo(1 - 0.1 / 0.34, 10),
      quadratic: expect.closeTo(1 - 0.05 / 0.21, 10),
      label: 'substantial',
    })
  })

  it('gives each examiner’s bias against their partners: the resident reads lower, the attending higher', async () => {
    const { resident, attending, educator } = await pairsOf([[-4, -3], [1, 2], [3, 5], [6, 6], [0, 0]])

    const { summary } = await summaryAs(app, educator.auth)

    const sd = expect.closeTo(Math.sqrt(0.7), 10)
    const near = (low: number, high: number) => [expect.closeTo(low, 5), expect.closeTo(high, 5)]
    expect(summary!.byExaminer).toEqual([
      { examinerId: resident.user.id, name: 'Dr Sam Whitcombe', role: 'resident', n: 5, bias: expect.closeTo(-0.8, 10), sd, loa: near(-2.439854, 0.839854) },
      { examinerId: attending.user.id, name: 'Dr Tomas Lindqvist', role: 'attending', n: 5, bias: expect.closeTo(0.8, 10), sd, loa: near(-0.839854, 2.439854) },
    ])
  })

  it('with no pairs, says why for every statistic instead of a number', async () => {
    const educator = await makeCaller({ roles: ['educator'] })

    const { res } = await summaryAs(app, educator.auth)

    const unavailable = { unavailable: 'Needs at least 2 pairs; none match' }
    const none = { n: 0, reason: expect.any(String) }
    expect(res.body).toEqual({
      n: 0,
      blandAltman: unavailable,
      icc: unavailable,
      kappaElevated: unavailable,
      kappaCategory: unavailable,
      byExaminer: [],
      leftOut: { heights: none, kappaElevated: none, kappaCategory: none },
    })
  })

  it('with one pair, says why and leaves the examiners’ spread empty, never NaN', async () => {
    const { educator } = await pairsOf([[2, 3]])

    const { res } = await summaryAs(app, educator.auth)

    expect(res.body.blandAltman).toEqual({ unavailable: 'Needs at least 2 pairs; only 1 matches' })
    expect(res.body.byExaminer.map((e: { n: number; bias: number; sd: null }) => [e.n, e.bias, e.sd])).toEqual([[1, -1, null], [1, 1, null]])
    expect(res.text).not.toMatch(/NaN|Infinity/)
  })

  it('when every reading is the same, gives the reason for the ICC and the kappas', async () => {
    const { educator } = await pairsOf([[4, 4], [4, 4], [4, 4]])

    const { res, summary } = await summaryAs(app, educator.auth)

    expect(summary!.blandAltman).toMatchObject({ bias: 0, sd: 0, loa: [0, 0] })
    expect(summary!.icc).toEqual({ unavailable: expect.any(String) })
    expect(summary!.kappaElevated).toEqual({ unavailable: expect.stringContaining('single category') })
    expect(summary!.kappaCategory).toEqual({ unavailable: expect.stringContaining('single category') })
    expect(res.text).not.toMatch(/NaN|null/)
  })
})

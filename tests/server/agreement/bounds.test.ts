import { beforeEach, describe, expect, it } from 'vitest'
import type { ExamInputRaw } from '#shared/schemas/exam'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, pairsAs, storeExam, summaryAs, trendAs } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 30 * DAY

type Read = Partial<ExamInputRaw>
const seen = (heightCm: number, inclinationDeg: number): Read => ({ columnTop: 'seen', heightCm, inclinationDeg })
const aboveNeck = (heightCm: number, inclinationDeg: number): Read => ({ columnTop: 'above-neck', heightCm, inclinationDeg })
const notFilled = (inclinationDeg = 0): Read => ({ columnTop: 'not-filled', heightCm: null, inclinationDeg })

/** A resident and then, 30 minutes later, an attending examine each patient (one patient a day). */
async function pairsOf(readings: [resident: Read, attending: Read][]) {
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  for (const [i, [r, a]] of readings.entries()) {
    const common = { teamId: team.id, patientCode: `SM-${2000 + i}` }
    await storeExam({ ...common, examinerId: resident.user.id, at: T0 + i * DAY, findings: r })
    await storeExam({ ...common, examinerId: attending.user.id, at: T0 + i * DAY + 30 * MINUTE, findings: a })
  }
  return { resident, attending, educator: await makeCaller({ roles: ['educator'] }) }
}

// Elevated when h > 3 cm above the sternal angle (McGee 1998, Am Heart J 136:10–18); categories low < 5, normal 5–10,
// high > 10 cmH₂O (Cook 1990) at CVP = h + offset, offsets 5.4 cm at 0°, 8.0 at 30°, 9.8 at 60° (Seth 2002, J Gen
// Intern Med 17:861–865). A lower bound (above the neck) is CVP ≥ h + offset, an upper bound (not filled) CVP ≤ offset.
const WARD: [Read, Read][] = [
  [seen(4, 30), seen(5, 30)], //           elevated/elevated, 12 high / 13 high
  [seen(1, 30), seen(2, 30)], //           not/not,           9 normal / 10 normal
  [aboveNeck(6, 60), seen(5, 60)], //      elevated/elevated, ≥ 15.8 high / 14.8 high
  [seen(1, 0), notFilled()], //            not/not,           6.4 normal / ≤ 5.4 low or normal: no category
  [aboveNeck(2, 60), seen(4, 60)], //      ≥ 2 cannot say / elevated; ≥ 11.8 high / 13.8 high
  [seen(2, 30), seen(4, 30)], //           not/elevated,      10 normal / 12 high
  [aboveNeck(4, 0), seen(5, 0)], //        elevated/elevated, ≥ 9.4 normal or high: no category / 10.4 high
]

describe('GET /api/agreement/summary: bounds count in the kappas', () => {
  it('counts an above-neck exam over 3 cm as elevated and a not-filled one as not elevated, leaving out a lower bound at or below 3 cm', async () => {
    // Pairs 1–4, 6, 7 (pair 5 left out): resident rows, attending columns, [not, elevated]: [[2, 1], [0, 3]].
    // p_o = 5/6, p_e = (3·2 + 3·4)/36 = 1/2 → κ = (5/6 − 1/2)/(1 − 1/2) = 2/3 (Cohen 1960), substantial (Landis & Koch 1977).
    const { educator } = await pairsOf(WARD)

    const { summary } = await summaryAs(app, educator.auth)

    expect(summary!.n).toBe(7)
    expect(summary!.kappaElevated).toEqual({ value: expect.closeTo(2 / 3, 10), label: 'substantial' })
    expect(summary!.leftOut!.kappaElevated).toEqual({ n: 1, reason: expect.stringContaining('above the neck at or below 3 cm') })
  })

  it('counts a bound in the category kappa only when its own limit decides one category', async () => {
    // Pairs 1–3, 5, 6 (pairs 4 and 7 left out): [normal, high] rows × columns [[1, 1], [0, 3]], no lows. Linear
    // weights |i − j|/2: observed 0.5/5 = 0.1, chance 0.5·(2·4 + 3·1)/25 = 0.22 → κ_w = 1 − 0.1/0.22 = 6/11; quadratic
    // weights (|i − j|/2)², only adjacent disagreements → also 6/11 (Cohen 1968); moderate (Landis & Koch 1977).
    const { educator } = await pairsOf(WARD)

    const { summary } = await summaryAs(app, educator.auth)

    expect(summary!.kappaCategory).toEqual({ linear: expect.closeTo(6 / 11, 10), quadratic: expect.closeTo(6 / 11, 10), label: 'moderate' })
    expect(summary!.leftOut!.kappaCategory).toEqual({ n: 2, reason: expect.stringContaining('more than one category') })
  })

  it('takes Bland–Altman, the ICC and the examiners’ bias only from pairs with a measured height on both sides', async () => {
    // Pairs 1, 2 and 6: differences −1, −1, −2 → bias −4/3, SD √(1/3) (Bland & Altman 1986).
    const { resident, educator } = await pairsOf(WARD)

    const { summary } = await summaryAs(app, educator.auth)

    expect(summary!.blandAltman).toMatchObject({ bias: expect.closeTo(-4 / 3, 10), sd: expect.closeTo(Math.sqrt(1 / 3), 10) })
    expect(summary!.byExaminer.find((e) => e.examinerId === resident.user.id)).toMatchObject({ n: 3, bias: expect.closeTo(-4 / 3, 10) })
    expect(summary!.leftOut!.heights).toEqual({ n: 4, reason: expect.stringContaining('bound') })
  })

  it('with fewer than 2 pairs of measured heights, says so for Bland–Altman and the ICC and still gives the kappas', async () => {
    const { educator } = await pairsOf([
      [aboveNeck(6, 60), seen(5, 60)],
      [seen(1, 0), notFilled()],
      [seen(2, 30), seen(4, 30)],
    ])

    const { res, summary } = await summaryAs(app, educator.auth)

    expect(summary!.blandAltman).toEqual({ unavailable: 'Needs at least 2 pairs with a measured height on both sides; only 1 of the 3 pairs has' })
    expect(summary!.icc).toEqual(summary!.blandAltman)
    expect(summary!.kappaElevated).toMatchObject({ value: expect.any(Number) })
    expect(res.text).not.toMatch(/NaN|Infinity/)
  })
})

describe('GET /api/agreement/pairs and /trend with bounds', () => {
  it('list and trend only the pairs with a measured height on both sides, the pairs the plots can draw', async () => {
    const { educator } = await pairsOf(WARD)

    const { list } = await pairsAs(app, educator.auth)
    const { trend } = await trendAs(app, educator.auth)

    expect(list!.total).toBe(3)
    expect(list!.pairs.map((p) => p.differenceCm).sort()).toEqual([-1, -1, -2].sort())
    expect(trend!.months.reduce((n, m) => n + m.n, 0)).toBe(3)
  })
})

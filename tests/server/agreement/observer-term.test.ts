import { randomUUID } from 'node:crypto'
import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { invalidateObserverTerm, observerTerm } from '../../../server/agreement/observer-term.ts'
import { AgreementPairModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, storeExams, storeRound } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
  invalidateObserverTerm()
})

interface PairOptions {
  /** Half the alternating difference: the resident reads 4 ± spread, the attending 4. */
  spreadCm?: number
  daysAgo?: number
  /** The attending's inclination when the resident's is 45°. */
  secondInclinationDeg?: number
}

/** Resident–attending pairs whose differences alternate +spread and −spread cm, one a day, ending `daysAgo` days ago. */
async function storePairs(count: number, { spreadCm = 2, daysAgo = 1, secondInclinationDeg = 45 }: PairOptions = {}) {
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  const findings = { inclinationDeg: secondInclinationDeg }
  await storeExams(
    Array.from({ length: count }, (_, i) => {
      const at = Date.now() - (daysAgo + i) * DAY
      const common = { teamId: team.id, patientCode: `SM-${daysAgo}-${secondInclinationDeg}-${i}` }
      return [
        { ...common, examinerId: resident.user.id, at, heightCm: i % 2 ? 4 - spreadCm : 4 + spreadCm },
        { ...common, examinerId: attending.user.id, at: at + 30 * MINUTE, heightCm: 4, findings },
      ]
    }).flat(),
  )
}

/** Three examiners read every subject as h − 2, h, h + 2: each subject's within SD is 2 cm. */
async function storeRoundOf(complete: number, { daysAgo = 7, incomplete = 0, status = 'closed' as 'open' | 'closed' } = {}) {
  const team = await makeTeam()
  const educator = await makeCaller({ roles: ['educator'] })
  const examiners = [await makeCaller({ teamIds: [team.id] }), await makeCaller({ teamIds: [team.id] }), await makeCaller({ teamIds: [team.id] })]
  const subjects = [
    ...Array.from({ length: complete }, (_, i) => [(i % 5) - 2, i % 5, (i % 5) + 2]),
    ...Array.from({ length: incomplete }, () => [1, 3, null]),
  ]
  const examinerIds = examiners.map((e) => e.user.id)
  const id = await storeRound({ educatorId: educator.user.id, teamId: team.id, examinerIds, subjects, closedAt: Date.now() - daysAgo * DAY, status })
  return { id, educator }
}

const DEFAULT_TERM = { source: 'default', sigmaCm: 2, n: null, ci: null }

describe('observerTerm: calibration rounds first', () => {
  it('with 30 complete subjects from rounds closed in the last year, is their pooled within-subject SD, with n and its CI', async () => {
    await storeRoundOf(30)

    const term = await observerTerm()

    // √MS_within: 30 subjects × within SS 8 on 2 df each → MS_within 4, σ_exam 2.0 on 60 df. 95% CI by χ²
    // (χ².975,60 = 83.298, χ².025,60 = 40.482, χ² table): [2·√(60/83.298), 2·√(60/40.482)] = [1.697, 2.435].
    expect(term.source).toBe('local-rounds')
    expect(term.sigmaCm).toBeCloseTo(2, 10)
    expect(term.n).toBe(30)
    expect(term.ci![0]).toBeCloseTo(1.697, 2)
    expect(term.ci![1]).toBeCloseTo(2.435, 2)
  })

  it('counts only complete subjects: 29 of them and an incomplete one are not enough', async () => {
    await storeRoundOf(29, { incomplete: 1 })

    const term = await observerTerm()

    expect(term).toEqual(DEFAULT_TERM)
  })

  it('pools subjects across rounds', async () => {
    await storeRoundOf(15)
    await storeRoundOf(15, { daysAgo: 200 })

    const term = await observerTerm()

    expect(term).toMatchObject({ source: 'local-rounds', n: 30 })
  })

  it('leaves out rounds closed more than 365 days ago, and open rounds', async () => {
    await storeRoundOf(29)
    await storeRoundOf(1, { daysAgo: 366 })
    await storeRoundOf(1, { status: 'open' })

    const term = await observerTerm()

    expect(term).toEqual(DEFAULT_TERM)
  })

  it('is preferred to routine pairs when both reach 30', async () => {
    await storeRoundOf(30)
    await storePairs(30)

    const term = await observerTerm()

    expect(term.source).toBe('local-rounds')
  })

  it('is recomputed when a round closes', async () => {
    const { id, educator } = await storeRoundOf(30, { status: 'open' })
    const before = await observerTerm()

    const closed = await request(app).post(`/api/rounds/${id}/close`).set('Authorization', educator.auth).send({})
    const after = await observerTerm()

    expect(closed.status).toBe(200)
    expect(before).toEqual(DEFAULT_TERM)
    expect(after.source).toBe('local-rounds')
  })
})

describe('observerTerm: routine pairs when rounds are too few', () => {
  it('with 30 pairs from the last year is SD(d)/√2 on n − 1 df, with its CI', async () => {
    await storePairs(30)

    const term = await observerTerm()

    // d = ±2 cm, mean 0: SD = √(120/29) = 2.0342, σ_exam = SD/√2 = 1.4384 on 29 df; 95% CI by χ² (χ².975,29 = 45.722,
    // χ².025,29 = 16.047, χ² table): [1.4384·√(29/45.722), 1.4384·√(29/16.047)] = [1.146, 1.934].
    expect(term.source).toBe('local-pairs')
    expect(term.sigmaCm).toBeCloseTo(Math.sqrt(120 / 29) / Math.SQRT2, 10)
    expect(term.n).toBe(30)
    expect(term.ci![0]).toBeCloseTo(1.146, 2)
    expect(term.ci![1]).toBeCloseTo(1.934, 2)
  })

  it('is the default 2.0 cm while there are fewer than 30 pairs', async () => {
    await storePairs(29)

    const term = await observerTerm()

    expect(term).toEqual(DEFAULT_TERM)
  })

  it('does not count pairs older than 365 days', async () => {
    await storePairs(29)
    await storePairs(1, { daysAgo: 366 })

    const term = await observerTerm()

    expect(term).toEqual(DEFAULT_TERM)
  })

  it('counts a pair whose two inclinations differ by 5°', async () => {
    await storePairs(29)
    await storePairs(1, { daysAgo: 100, secondInclinationDeg: 50 })

    const term = await observerTerm()

    expect(term).toMatchObject({ source: 'local-pairs', n: 30 })
  })

  it('leaves out a pair whose two inclinations differ by more than 5°: posture, not reading, would differ', async () => {
    await storePairs(29)
    await storePairs(1, { daysAgo: 100, secondInclinationDeg: 51 })

    const term = await observerTerm()

    expect(term).toEqual(DEFAULT_TERM)
  })

  it('never goes below the 1.0 cm floor (product default)', async () => {
    await storePairs(30, { spreadCm: 1 })

    const term = await observerTerm()

    // SD(d)/√2 = √(30/29)/√2 = 0.72 cm, below the floor
    expect(term).toMatchObject({ source: 'local-pairs', sigmaCm: 1 })
  })

  it('keeps its cached value while no exam and no setting changed, until invalidated here', async () => {
    await storePairs(29)
    const before = await observerTerm()
    await copyOnePair()

    const cached = await observerTerm()
    invalidateObserverTerm()
    const recomputed = await observerTerm()

    expect(before.source).toBe('default')
    expect(cached.source).toBe('default')
    expect(recomputed.source).toBe('local-pairs')
  })

  it('recomputes once an exam is written, with nothing invalidated in this process (as when another server wrote it)', async () => {
    await storePairs(29)
    const before = await observerTerm()

    await storePairs(1, { daysAgo: 100 })
    const after = await observerTerm()

    expect(before.source).toBe('default')
    expect(after.source).toBe('local-pairs')
  })
})

/** One more stored pair written straight into the table, as no exam write does: the term's inputs stay as they were. */
async function copyOnePair() {
  const q = AgreementPairModel.sequelize!.getQueryInterface()
  const [row] = (await AgreementPairModel.findAll({ limit: 1, raw: true })) as unknown as Record<string, unknown>[]
  await q.bulkInsert('agreement_pairs', [{ ...row, earlierExamId: randomUUID(), laterExamId: randomUUID() }])
}

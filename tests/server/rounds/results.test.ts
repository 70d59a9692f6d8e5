import { beforeEach, describe, expect, it } from 'vitest'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { fleissKappa, icc } from '#shared/stats/index'
import { makeTestApp } from '../helpers.ts'
import { calibrationWard, closeRoundAs, codes, openRound, pseudonym, recordDraftEntry, recordEntry, recordMatrix, resultsAs } from './round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

// Shrout & Fleiss 1979 (Psychol Bull 86:420–428), Table 2: 6 targets × 4 judges, here as heights in cm above the sternal angle.
const SHROUT_FLEISS = [
  [9, 2, 5, 8],
  [6, 1, 3, 2],
  [8, 4, 6, 8],
  [7, 1, 2, 6],
  [10, 5, 6, 9],
  [6, 2, 4, 7],
]

describe('results of a closed round (GET /api/rounds/:id/results)', () => {
  it('reproduces Shrout & Fleiss’s ICC(2,1) with its 95% CI, examiners as judges and patient codes as targets', async () => {
    const { ward, educator, examiners } = await calibrationWard(4)
    const round = await openRound(app, educator, codes(6), examiners)
    await recordMatrix(app, examiners, ward.id, round.id, codes(6), SHROUT_FLEISS)
    await closeRoundAs(app, educator.auth, round.id)

    const { res, results } = await resultsAs(app, educator.auth, round.id)

    expect(res.status).toBe(200)
    expect(results!.completeSubjects).toBe(6)
    expect(results!.raters).toBe(4)
    expect(results!.missing.count).toBe(0)
    // Shrout & Fleiss 1979: ICC(2,1) = .29; exact 0.2897637795 and CI [0.0188, 0.7611] as R's psych::ICC computes them.
    expect('value' in results!.icc && results!.icc.value).toBeCloseTo(0.2897637795, 9)
    expect('ci' in results!.icc && results!.icc.ci[0]).toBeCloseTo(0.0188, 4)
    expect('ci' in results!.icc && results!.icc.ci[1]).toBeCloseTo(0.7611, 4)
    expect(results!.heights).toEqual(SHROUT_FLEISS)
    expect(results!.caution).toBe(CAUTION_TEXT)
  })

  it('Fleiss’ kappa on elevated (h > 3 cm) and each examiner’s bias against the subject mean, computed by hand', async () => {
    const { ward, educator, examiners } = await calibrationWard(4)
    const round = await openRound(app, educator, codes(6), examiners)
    await recordMatrix(app, examiners, ward.id, round.id, codes(6), SHROUT_FLEISS)
    await closeRoundAs(app, educator.auth, round.id)

    const { results } = await resultsAs(app, examiners[2]!.auth, round.id)

    // By hand (common practice, Fleiss 1971's formulas): elevated counts per subject 3,1,4,2,4,3 of 4; P̄ = 23/36,
    // p(elevated) = 17/24, P̄e = (17² + 7²)/24² = 338/576, κ = (23/36 − 338/576) / (1 − 338/576) = 30/238 = 0.12605.
    expect('value' in results!.fleissElevated && results!.fleissElevated.value).toBeCloseTo(30 / 238, 10)
    expect('label' in results!.fleissElevated && results!.fleissElevated.label).toBe('slight')
    // Bias = examiner's column mean − grand mean (127/24), since every subject is complete: 46/6, 15/6, 26/6, 40/6.
    const grand = 127 / 24
    expect(results!.byExaminer.map((b) => b.bias)).toEqual(
      [46 / 6 - grand, 15 / 6 - grand, 26 / 6 - grand, 40 / 6 - grand].map((v) => expect.closeTo(v, 10)),
    )
    expect(results!.byExaminer.every((b) => b.n === 6)).toBe(true)
    expect(results!.elevatedAboveCm).toBe(3)
  })

  it('leaves incomplete subjects out of ICC, kappa and bias, and lists the missing entries (drafts and unmeasured columns count as missing)', async () => {
    const { ward, educator, examiners } = await calibrationWard(3)
    const subjects = codes(4)
    const matrix = [
      [1, 2, 4],
      [5, 5, 7],
      [null, 3, 3],
      [8, 6, 9],
    ]
    const round = await openRound(app, educator, subjects, examiners)
    await recordMatrix(app, examiners, ward.id, round.id, subjects, matrix)
    await recordDraftEntry(app, examiners[0]!, ward.id, round.id, subjects[2]!, 2)
    await recordEntry(app, examiners[2]!, ward.id, round.id, subjects[1]!, 0, {
      columnTop: 'not-assessable',
      notAssessableReason: 'habitus',
      heightCm: null,
      examinedAt: new Date(Date.now() - 30 * 60_000).toISOString(),
    })
    await closeRoundAs(app, educator.auth, round.id)

    const { results } = await resultsAs(app, educator.auth, round.id)

    // SM-0302's latest entry by examiner 3 is the unmeasured one, so SM-0300 and SM-0303 remain complete.
    // The educator reads the codes as pseudonyms.
    expect(results!.completeSubjects).toBe(2)
    expect(results!.incompleteCodes).toEqual([pseudonym(subjects[1]!), pseudonym(subjects[2]!)])
    expect(results!.missing.count).toBe(2)
    expect(results!.missing.entries).toEqual([
      { examinerId: examiners[2]!.user.id, examinerName: 'Examiner 3', patientCode: pseudonym(subjects[1]!), reason: 'not-measured' },
      { examinerId: examiners[0]!.user.id, examinerName: 'Examiner 1', patientCode: pseudonym(subjects[2]!), reason: 'not-recorded' },
    ])
    // Not an outside check: it shows the round feeds only its complete rows to shared/stats, whose ICC and Fleiss kappa
    // are checked against Shrout & Fleiss 1979 and Fleiss 1971 in tests/shared/stats (and above, on the full round).
    const complete = [matrix[0]!, matrix[3]!] as number[][]
    const expectedIcc = icc(complete)
    expect(expectedIcc.ok && 'value' in results!.icc && results!.icc.value).toBeCloseTo(expectedIcc.ok ? expectedIcc.icc2.value : NaN, 12)
    const expectedKappa = fleissKappa(complete.map((row) => [row.filter((h) => h > 3).length, row.filter((h) => h <= 3).length]))
    expect(expectedKappa.ok && 'value' in results!.fleissElevated && results!.fleissElevated.value).toBeCloseTo(expectedKappa.ok ? expectedKappa.value : NaN, 12)
    // Bias over the two complete subjects (means 7/3 and 23/3): examiner 1: ((1 − 7/3) + (8 − 23/3)) / 2 = −1/2.
    expect(results!.byExaminer[0]!.bias).toBeCloseTo(-0.5, 12)
    expect(results!.byExaminer[0]!.n).toBe(2)
  })

  it('with fewer than two complete subjects, or no spread, gives a stated reason instead of a number', async () => {
    const { ward, educator, examiners } = await calibrationWard(2)
    const few = await openRound(app, educator, codes(2), examiners, 'Too few')
    await recordMatrix(app, examiners, ward.id, few.id, codes(2), [[4, 5], [6, null]])
    await closeRoundAs(app, educator.auth, few.id)
    const same = await openRound(app, educator, codes(2, 500), examiners, 'All alike')
    await recordMatrix(app, examiners, ward.id, same.id, codes(2, 500), [[4, 4], [4, 4]])
    await closeRoundAs(app, educator.auth, same.id)

    const { res, results } = await resultsAs(app, educator.auth, few.id)
    const { results: alike } = await resultsAs(app, educator.auth, same.id)

    expect(res.text).not.toMatch(/NaN|null,"ci"/)
    expect(results!.icc).toEqual({ unavailable: expect.stringMatching(/at least 2 patient codes.*only 1/) })
    expect(results!.fleissElevated).toEqual({ unavailable: expect.stringMatching(/at least 2/) })
    expect(alike!.icc).toEqual({ unavailable: 'All ratings are identical' })
    expect(alike!.fleissElevated).toEqual({ unavailable: expect.stringMatching(/single category/) })
    expect(alike!.byExaminer.map((b) => b.bias)).toEqual([0, 0])
  })

  it('uses each examiner’s latest submitted exam of a code', async () => {
    const { ward, educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, codes(2), examiners)
    const hourAgo = (h: number) => new Date(Date.now() - h * 3_600_000).toISOString()
    await recordEntry(app, examiners[0]!, ward.id, round.id, codes(2)[0]!, 9, { examinedAt: hourAgo(1) })
    await recordEntry(app, examiners[0]!, ward.id, round.id, codes(2)[0]!, 1, { examinedAt: hourAgo(3) })
    await recordMatrix(app, examiners, ward.id, round.id, codes(2), [[null, 2], [5, 6]])
    await closeRoundAs(app, educator.auth, round.id)

    const { results } = await resultsAs(app, educator.auth, round.id)

    expect(results!.heights).toEqual([[9, 2], [5, 6]])
  })

  it('answers 409 while the round is open, and 404 to someone outside it', async () => {
    const { educator, examiners, outsider } = await calibrationWard(2)
    const round = await openRound(app, educator, codes(1), examiners)

    const open = await resultsAs(app, educator.auth, round.id)
    await closeRoundAs(app, educator.auth, round.id)
    const stranger = await resultsAs(app, outsider.auth, round.id)

    expect(open.res.status).toBe(409)
    expect(open.res.body.error.code).toBe('round-open')
    expect(stranger.res.status).toBe(404)
  })
})

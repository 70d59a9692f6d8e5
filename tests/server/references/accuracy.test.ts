import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { AccuracySummarySchema } from '#shared/schemas/reference'
import type { Exam, ExamInputRaw } from '#shared/schemas/exam'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { makeWard } from '../supervision/ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

type Ward = Awaited<ReturnType<typeof makeWard>>
let codes = 0

async function examWith(ward: Ward, findings: Partial<ExamInputRaw>): Promise<Exam> {
  return recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: `AC-${++codes}`, ...findings })
}

async function reference(ward: Ward, exam: Exam, valueCmH2O: number, kind = 'central-line', minutesAfter = 15) {
  const measuredAt = new Date(new Date(exam.examinedAt).getTime() + minutesAfter * 60_000).toISOString()
  const res = await request(app)
    .post(`/api/exams/${exam.id}/references`)
    .set('Authorization', ward.resident.auth)
    .send({ kind, value: valueCmH2O, unit: 'cmH2O', measuredAt })
  if (res.status !== 201) throw new Error(`reference: ${res.status} ${JSON.stringify(res.body)}`)
}

const band = (exam: Exam) => exam.estimate.bandCmH2O!

/**
 * Five pairs: three point estimates with references at estimate − 1, + 3 and + 10 cmH₂O (d = +1, −3, −10; the band is
 * about ±4.5 cmH₂O wide at 45°, so the first two are inside), an upper bound ("not filled") with its reference 3 below
 * its limit (inside, on the open side) and a lower bound (above the neck) with its reference 1 below its limit (outside).
 */
async function fivePairs(ward: Ward) {
  const points = [await examWith(ward, { heightCm: 4 }), await examWith(ward, { heightCm: 6 }), await examWith(ward, { heightCm: 2 })]
  await reference(ward, points[0]!, points[0]!.estimate.cvpCmH2O! - 1)
  await reference(ward, points[1]!, points[1]!.estimate.cvpCmH2O! + 3, 'catheter-ra')
  await reference(ward, points[2]!, points[2]!.estimate.cvpCmH2O! + 10)
  const upper = await examWith(ward, { columnTop: 'not-filled', heightCm: null, inclinationDeg: 0 })
  await reference(ward, upper, band(upper)[1]! - 3)
  const lower = await examWith(ward, { columnTop: 'above-neck', heightCm: 10, inclinationDeg: 60 })
  await reference(ward, lower, band(lower)[0]! - 1)
}

function accuracy(auth: string, query = '') {
  return request(app).get(`/api/agreement/accuracy${query}`).set('Authorization', auth)
}

describe('GET /api/agreement/accuracy', () => {
  it('gives bias, SD and limits of estimate − reference over the point estimates, and coverage with its Wilson interval', async () => {
    const ward = await makeWard()
    await fivePairs(ward)

    const res = await accuracy(ward.attending.auth)

    expect(res.status).toBe(200)
    const summary = AccuracySummarySchema.parse(res.body)
    // d = +1, −3, −10: mean −4; squared deviations 25 + 1 + 36 = 62; SD = √(62 / 2) = √31 = 5.567764.
    expect(summary.n).toBe(3)
    expect(summary.bias).toBeCloseTo(-4, 9)
    expect(summary.sd).toBeCloseTo(5.567764, 6)
    expect(summary.loa![0]).toBeCloseTo(-4 - 1.96 * 5.567764, 5)
    expect(summary.loa![1]).toBeCloseTo(-4 + 1.96 * 5.567764, 5)
    // 3 of 5 inside; Wilson 95% for 3/5 = 0.2307–0.8824 (centre 0.55655 ± 0.32584 by the score formula).
    expect(summary.coverage).toMatchObject({ inside: 3, n: 5, share: 0.6 })
    expect(summary.coverage.ci![0]).toBeCloseTo(0.2307, 4)
    expect(summary.coverage.ci![1]).toBeCloseTo(0.8824, 4)
    expect(summary.points.map((p) => [p.bound, p.inside])).toEqual([
      ['point', true],
      ['point', true],
      ['point', false],
      ['upper', true],
      ['lower', false],
    ])
    expect(summary.caution).toMatch(/estimate/i)
  })

  it('leaves out references outside the window, exams still in draft and exams without an estimate', async () => {
    const ward = await makeWard()
    const paired = await examWith(ward, { heightCm: 4 })
    await reference(ward, paired, 12)
    await reference(ward, await examWith(ward, { heightCm: 4 }), 12, 'central-line', 61)
    await reference(ward, await recordExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'AC-draft' }), 12)
    const notAssessable = { columnTop: 'not-assessable', heightCm: null, notAssessableReason: 'habitus' } as const
    await reference(ward, await examWith(ward, notAssessable), 12)

    const summary = AccuracySummarySchema.parse((await accuracy(ward.attending.auth)).body)

    expect(summary.coverage.n).toBe(1)
    expect(summary.points.map((p) => p.examId)).toEqual([paired.id])
  })

  it('filters by kind of reference and by the time of the exam', async () => {
    const ward = await makeWard()
    await fivePairs(ward)
    const twoHoursAgo = encodeURIComponent(new Date(Date.now() - 2 * 60 * 60_000).toISOString())
    const now = encodeURIComponent(new Date().toISOString())

    const byKind = AccuracySummarySchema.parse((await accuracy(ward.attending.auth, '?kind=catheter-ra')).body)
    const fromNow = AccuracySummarySchema.parse((await accuracy(ward.attending.auth, `?from=${now}`)).body)
    const untilNow = AccuracySummarySchema.parse((await accuracy(ward.attending.auth, `?from=${twoHoursAgo}&to=${now}`)).body)

    expect([byKind.n, byKind.coverage.n, byKind.bias]).toEqual([1, 1, null])
    expect([fromNow.coverage.n, untilNow.coverage.n]).toEqual([0, 5])
  })

  it('shows attendings their own teams only and educators the whole program, optionally by team', async () => {
    const ward = await makeWard()
    await fivePairs(ward)
    const elsewhere = await makeCaller({ roles: ['attending'], teamIds: [(await makeTeam()).id] })
    const educator = await makeCaller({ roles: ['educator'] })

    const theirs = AccuracySummarySchema.parse((await accuracy(elsewhere.auth)).body)
    const program = AccuracySummarySchema.parse((await accuracy(educator.auth)).body)
    const byTeam = AccuracySummarySchema.parse((await accuracy(educator.auth, `?teamId=${ward.team.id}`)).body)

    expect([theirs.coverage.n, program.coverage.n, byTeam.coverage.n]).toEqual([0, 5, 5])
  })

  it('refuses residents and an attending asking about another team with 403, and a bad range with 400', async () => {
    const ward = await makeWard()
    const other = await makeTeam()

    const resident = await accuracy(ward.resident.auth)
    const otherTeam = await accuracy(ward.attending.auth, `?teamId=${other.id}`)
    const range = await accuracy(ward.attending.auth, '?from=2026-12-02T00:00:00Z&to=2026-12-01T00:00:00Z')

    expect([resident.status, otherTeam.status, range.status]).toEqual([403, 403, 400])
    expect(range.body.error.fields).toHaveProperty('to')
  })
})

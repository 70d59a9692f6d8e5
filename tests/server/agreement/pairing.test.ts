import { beforeEach, describe, expect, it } from 'vitest'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, pairsAs, storeExam, summaryAs } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const T0 = Date.now() - 30 * DAY

/** A ward with two residents and an attending, and an educator who reads every pair. */
async function ward() {
  const team = await makeTeam('Ward 7 North')
  const join = (roles: ('resident' | 'attending')[], displayName: string) => makeCaller({ roles, teamIds: [team.id], displayName })
  const resident = await join(['resident'], 'Dr Sam Whitcombe')
  const resident2 = await join(['resident'], 'Dr Aiko Brennan')
  const attending = await join(['attending'], 'Dr Tomas Lindqvist')
  const educator = await makeCaller({ roles: ['educator'] })
  const exam = (who: { user: { id: string } }, minutes: number, more: Partial<Parameters<typeof storeExam>[0]> = {}) =>
    storeExam({ examinerId: who.user.id, teamId: team.id, at: T0 + minutes * MINUTE, ...more })
  return { team, resident, resident2, attending, educator, exam }
}

describe('GET /api/agreement/pairs: which exams form a pair', () => {
  it('pairs two exams of one patient by different examiners exactly 120 minutes apart', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(resident, 0)
    await exam(attending, 120)

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.total).toBe(1)
    expect(list!.pairs[0]!.minutesApart).toBe(120)
  })

  it('does not pair exams 121 minutes apart', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(resident, 0)
    await exam(attending, 121)

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.total).toBe(0)
  })

  it('does not pair two exams by the same examiner', async () => {
    const { resident, educator, exam } = await ward()
    await exam(resident, 0)
    await exam(resident, 30)

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.total).toBe(0)
  })

  it('does not pair exams of different patients', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(resident, 0, { patientCode: 'SM-0142' })
    await exam(attending, 30, { patientCode: 'SM-0157' })

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.total).toBe(0)
  })

  it('leaves drafts out', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(resident, 0, { status: 'draft' })
    await exam(attending, 30)

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.total).toBe(0)
  })

  it('counts countersigned and returned exams, not only submitted ones', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(resident, 0, { status: 'returned' })
    await exam(attending, 30, { status: 'countersigned' })

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.total).toBe(1)
  })

  it('pairs an exam whose column top was above the neck or not filled like a seen one, so the kappas can count it', async () => {
    // Bounds count in the kappas: above the neck over 3 cm is elevated, not filled is not (McGee 1998, Am Heart J 136:10–18).
    const { resident, resident2, attending, educator, exam } = await ward()
    await exam(resident, 0, { findings: { columnTop: 'above-neck', heightCm: 8, inclinationDeg: 60 } })
    await exam(attending, 20)
    await exam(resident2, 0, { patientCode: 'SM-0157', findings: { columnTop: 'not-filled', heightCm: null, inclinationDeg: 0 } })
    await exam(attending, 30, { patientCode: 'SM-0157' })

    const { summary } = await summaryAs(app, educator.auth)

    expect(summary!.n).toBe(2)
    expect(summary!.leftOut!.heights.n).toBe(2)
  })

  it('leaves out an exam whose column could not be assessed', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(resident, 0, { findings: { columnTop: 'not-assessable', heightCm: null, notAssessableReason: 'habitus' } })
    await exam(attending, 20)

    const { summary } = await summaryAs(app, educator.auth)

    expect(summary!.n).toBe(0)
  })

  it('pairs each exam at most once, the two nearest in time first', async () => {
    const { resident, resident2, attending, educator, exam } = await ward()
    const early = await exam(resident, 0, { heightCm: 1 })
    const near = await exam(resident2, 90, { heightCm: 2 })
    const nearest = await exam(attending, 100, { heightCm: 3 })

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.total).toBe(1)
    expect([list!.pairs[0]!.first.examId, list!.pairs[0]!.second.examId].sort()).toEqual([near.id, nearest.id].sort())
    expect(list!.pairs.flatMap((p) => [p.first.examId, p.second.examId])).not.toContain(early.id)
  })

  it('shows both examiners, times, heights, inclination and vein of each pair', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(resident, 0, { heightCm: 3, findings: { inclinationDeg: 30, vein: 'right-external' } })
    await exam(attending, 45, { heightCm: 4.5 })

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.pairs[0]).toMatchObject({
      order: 'resident-minus-attending',
      differenceCm: -1.5,
      meanCm: 3.75,
      minutesApart: 45,
      first: {
        examinerName: 'Dr Sam Whitcombe',
        role: 'resident',
        examinedAt: new Date(T0).toISOString(),
        heightCm: 3,
        inclinationDeg: 30,
        vein: 'right-external',
      },
      second: { examinerName: 'Dr Tomas Lindqvist', role: 'attending', heightCm: 4.5, inclinationDeg: 45, vein: 'right-internal' },
    })
  })
})

describe('GET /api/agreement/pairs: the sign of the difference', () => {
  it('is resident − attending, even when the attending examined first', async () => {
    const { resident, attending, educator, exam } = await ward()
    await exam(attending, 0, { heightCm: 5 })
    await exam(resident, 40, { heightCm: 3.5 })

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.pairs[0]).toMatchObject({ order: 'resident-minus-attending', differenceCm: -1.5, first: { role: 'resident' } })
  })

  it('is earlier − later between two residents', async () => {
    const { resident, resident2, educator, exam } = await ward()
    await exam(resident2, 0, { heightCm: 2 })
    await exam(resident, 40, { heightCm: 4 })

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.pairs[0]).toMatchObject({ order: 'earlier-minus-later', differenceCm: -2, first: { examinerName: 'Dr Aiko Brennan' } })
  })

  it('is earlier − later between two attendings', async () => {
    const { team, educator, exam } = await ward()
    const consultant = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
    const other = await makeCaller({ roles: ['attending', 'educator'], teamIds: [team.id] })
    await exam(consultant, 0, { heightCm: 6 })
    await exam(other, 40, { heightCm: 5 })

    const { list } = await pairsAs(app, educator.auth)

    expect(list!.pairs[0]).toMatchObject({ order: 'earlier-minus-later', differenceCm: 1 })
  })
})

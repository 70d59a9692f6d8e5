import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { RoundListSchema } from '#shared/schemas/round'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { calibrationWard, closeRoundAs, createRoundAs, detailAs, openRound, pseudonym, recordDraftEntry, recordEntry, resultsAs, type Caller } from './round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const CODES = ['SM-0501', 'SM-0502', 'WD-77A']

/** Every round endpoint's body as the caller receives it, errors included. */
async function bodiesOf(caller: Caller, roundId: string) {
  const list = await request(app).get('/api/rounds').set('Authorization', caller.auth)
  const detail = await request(app).get(`/api/rounds/${roundId}`).set('Authorization', caller.auth)
  const results = await request(app).get(`/api/rounds/${roundId}/results`).set('Authorization', caller.auth)
  return [list.body, detail.body, results.body]
}

/** The round's codes that appear anywhere in the bodies, compared without regard to case. */
function realCodesIn(bodies: unknown[]): string[] {
  const text = JSON.stringify(bodies).toUpperCase()
  return CODES.filter((code) => text.includes(code.toUpperCase()))
}

/** A round of CODES, 3 residents: examiner 1 records the first two codes, examiner 2 keeps a draft of the first. */
async function roundInProgress() {
  const setup = await calibrationWard(3)
  const { ward, educator, examiners } = setup
  const created = await createRoundAs(app, educator.auth, { name: 'Follow-up of SM-0501', patientCodes: CODES, examinerIds: examiners.map((e) => e.user.id) })
  const roundId = created.body.id as string
  const first = await recordEntry(app, examiners[0]!, ward.id, roundId, CODES[0]!, 3)
  await recordEntry(app, examiners[0]!, ward.id, roundId, CODES[1]!, 5)
  await recordDraftEntry(app, examiners[1]!, ward.id, roundId, CODES[0]!, 4)
  return { ...setup, created, roundId, first }
}

describe('patient codes in calibration rounds', () => {
  it('the educator never receives a real code from any round endpoint, open or closed, errors included; only pseudonyms', async () => {
    const { educator, created, roundId } = await roundInProgress()

    const whileOpen = await bodiesOf(educator, roundId)
    const close = await closeRoundAs(app, educator.auth, roundId)
    const closeAgain = await closeRoundAs(app, educator.auth, roundId)
    const afterClose = await bodiesOf(educator, roundId)

    expect(created.status).toBe(201)
    expect(close.status).toBe(200)
    expect(closeAgain.status).toBe(409)
    expect(realCodesIn([created.body, ...whileOpen, close.body, closeAgain.body, ...afterClose])).toEqual([])
    expect(created.body.patientCodes).toEqual(CODES.map(pseudonym))
    expect(created.body.name).toBe(`Follow-up of ${pseudonym('SM-0501')}`)
    expect(created.body.codesMasked).toBe(true)
    const [, detail, results] = afterClose
    expect(detail.entries.map((e: { patientCode: string }) => e.patientCode)).toEqual(CODES.flatMap((c) => [c, c, c].map(pseudonym)))
    expect(results.patientCodes).toEqual(CODES.map(pseudonym))
    expect(results.incompleteCodes).toEqual(CODES.map(pseudonym))
    expect(results.missing.entries.every((e: { patientCode: string }) => /^P-[0-9a-f]{8}$/.test(e.patientCode))).toBe(true)
    expect(results.codesMasked).toBe(true)
  })

  it('an examiner of the round reads its real codes everywhere, as recorded at the bedside', async () => {
    const { educator, examiners, roundId } = await roundInProgress()
    await closeRoundAs(app, educator.auth, roundId)

    const [list, detail, results] = await bodiesOf(examiners[2]!, roundId)

    expect(realCodesIn([list])).toEqual(CODES)
    expect(RoundListSchema.parse(list).rounds[0]).toMatchObject({ patientCodes: CODES, codesMasked: false })
    expect(detail.patientCodes).toEqual(CODES)
    expect(detail.codesMasked).toBe(false)
    expect(detail.entries.map((e: { patientCode: string }) => e.patientCode)).toEqual(CODES.flatMap((c) => [c, c, c]))
    expect(results.incompleteCodes).toEqual(CODES)
    expect(results.missing.entries.map((e: { patientCode: string }) => e.patientCode)).toContain('WD-77A')
    expect(results.codesMasked).toBe(false)
  })

  it('after close the educator gets an entry’s exam id with the pseudonym that exam shows them; the examiner with the real code', async () => {
    const { educator, examiners, roundId, first } = await roundInProgress()
    await closeRoundAs(app, educator.auth, roundId)

    const { round: educatorGrid } = await detailAs(app, educator.auth, roundId)
    const { round: examinerGrid } = await detailAs(app, examiners[1]!.auth, roundId)
    const exam = await request(app).get(`/api/exams/${first.id}`).set('Authorization', educator.auth)

    const cellOf = (grid: typeof educatorGrid) => grid!.entries.find((e) => e.examId === first.id)
    expect(cellOf(educatorGrid)).toMatchObject({ examinerId: examiners[0]!.user.id, patientCode: pseudonym('SM-0501'), heightCm: 3 })
    expect(exam.body.patientCode).toBe(pseudonym('SM-0501'))
    expect(cellOf(examinerGrid)).toMatchObject({ examinerId: examiners[0]!.user.id, patientCode: 'SM-0501', heightCm: 3 })
  })

  it('an educator who is also the examiners’ attending (so reads the exam with its real code) gets no exam id next to a pseudonym', async () => {
    const { ward, examiners } = await calibrationWard(2)
    const educatorAttending = await makeCaller({ roles: ['educator', 'attending'], teamIds: [ward.id] })
    const round = await openRound(app, educatorAttending, ['SM-0501', 'SM-0502'], examiners)
    const entry = await recordEntry(app, examiners[0]!, ward.id, round.id, 'SM-0501', 3)
    await closeRoundAs(app, educatorAttending.auth, round.id)

    const { round: grid } = await detailAs(app, educatorAttending.auth, round.id)
    const exam = await request(app).get(`/api/exams/${entry.id}`).set('Authorization', educatorAttending.auth)

    expect(exam.body.patientCode).toBe('SM-0501')
    const cell = grid!.entries.find((e) => e.examinerId === examiners[0]!.user.id && e.patientCode === pseudonym('SM-0501'))
    expect(cell).toMatchObject({ state: 'recorded', examId: null, heightCm: 3 })
    expect(JSON.stringify(grid).toUpperCase()).not.toContain('SM-0501')
  })

  it('the results of an open round (409) and of a round outside one’s reach (404) name no code either', async () => {
    const { educator, roundId } = await roundInProgress()
    const otherEducator = await makeCaller({ roles: ['educator'] })

    const { res: open } = await resultsAs(app, educator.auth, roundId)
    const stranger = await bodiesOf(otherEducator, roundId)

    expect(open.status).toBe(409)
    expect(realCodesIn([open.body, ...stranger])).toEqual([])
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamListSchema } from '#shared/schemas/exam'
import { SyncPullResponseSchema } from '#shared/schemas/sync'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { pull } from '../sync/sync-calls.ts'
import { calibrationWard, closeRoundAs, detailAs, openRound, pseudonym, recordEntry } from './round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const readAs = (auth: string, id: string) => request(app).get(`/api/exams/${id}`).set('Authorization', auth)
async function listIds(auth: string) {
  const res = await request(app).get('/api/exams').set('Authorization', auth)
  return ExamListSchema.parse(res.body).exams.map((e) => e.id)
}
async function pulledIds(auth: string) {
  return SyncPullResponseSchema.parse((await pull(app, auth, 0)).body).exams.map((e) => e.id)
}

/** A round of two codes; examiner 1 (a resident) and examiner 2 (an attending of the same ward) record SM-0301. */
async function roundWithEntries() {
  const setup = await calibrationWard(2, true)
  const [resident, attending] = setup.examiners as [typeof setup.examiners[0], typeof setup.examiners[0]]
  const round = await openRound(app, setup.educator, ['SM-0301', 'SM-0302'], setup.examiners)
  const residentEntry = await recordEntry(app, resident, setup.ward.id, round.id, 'SM-0301', 2)
  const attendingEntry = await recordEntry(app, attending, setup.ward.id, round.id, 'SM-0301', 4)
  return { ...setup, resident, attending, round, residentEntry, attendingEntry }
}

describe('blinding of an open round', () => {
  it('an examiner asking for another examiner’s entry gets 403 before close and reads it after', async () => {
    const { educator, resident, attending, round, residentEntry, attendingEntry } = await roundWithEntries()

    const before = await readAs(resident.auth, attendingEntry.id)
    const otherWay = await readAs(attending.auth, residentEntry.id)
    const own = await readAs(resident.auth, residentEntry.id)
    await closeRoundAs(app, educator.auth, round.id)
    const after = await readAs(resident.auth, attendingEntry.id)

    expect(before.status).toBe(403)
    expect(before.body.error.code).toBe('round-blinded')
    expect(before.body.heightCm).toBeUndefined()
    expect(otherWay.status).toBe(403)
    expect(own.status).toBe(200)
    expect(after.status).toBe(200)
    expect(after.body.heightCm).toBe(4)
    expect(after.body.patientCode).toBe('SM-0301')
    expect((await readAs(attending.auth, residentEntry.id)).status).toBe(200)
  })

  it('two residents of the round open each other’s entries once it closes, though the entries stay out of each other’s exam log', async () => {
    const { ward, educator, examiners, outsider } = await calibrationWard(2)
    const round = await openRound(app, educator, ['SM-0301'], examiners)
    const entry = await recordEntry(app, examiners[1]!, ward.id, round.id, 'SM-0301', 3)

    await closeRoundAs(app, educator.auth, round.id)
    const read = await readAs(examiners[0]!.auth, entry.id)

    expect(read.status).toBe(200)
    expect(read.body.patientCode).toBe('SM-0301')
    expect((await readAs(outsider.auth, entry.id)).status).toBe(404)
    expect(await listIds(examiners[0]!.auth)).toEqual([])
  })

  it('the round’s educator sees progress but no values before close (403 on the exam), and both after', async () => {
    const { educator, resident, round, residentEntry } = await roundWithEntries()

    const exam = await readAs(educator.auth, residentEntry.id)
    const { round: grid } = await detailAs(app, educator.auth, round.id)
    await closeRoundAs(app, educator.auth, round.id)
    const examAfter = await readAs(educator.auth, residentEntry.id)
    const { round: gridAfter } = await detailAs(app, educator.auth, round.id)

    expect(exam.status).toBe(403)
    const cell = (g: typeof grid) => g!.entries.find((e) => e.examinerId === resident.user.id && e.patientCode === pseudonym('SM-0301'))
    expect(cell(grid)).toMatchObject({ state: 'recorded', examId: null, heightCm: null })
    expect(examAfter.status).toBe(200)
    expect(examAfter.body.patientCode).toBe(pseudonym('SM-0301')) // educators read codes masked, on the exam as on the round
    expect(cell(gridAfter)).toMatchObject({ state: 'recorded', examId: residentEntry.id, heightCm: 2 })
  })

  it('an examiner’s progress grid shows their own values and only the state of the others’', async () => {
    const { resident, attending, round } = await roundWithEntries()

    const { round: grid } = await detailAs(app, resident.auth, round.id)

    const mine = grid!.entries.find((e) => e.examinerId === resident.user.id && e.patientCode === 'SM-0301')
    const theirs = grid!.entries.find((e) => e.examinerId === attending.user.id && e.patientCode === 'SM-0301')
    expect(mine).toMatchObject({ state: 'recorded', heightCm: 2 })
    expect(theirs).toMatchObject({ state: 'recorded', examId: null, heightCm: null })
  })

  it('entries are left out of other readers’ lists and sync pulls until close, then appear', async () => {
    const { educator, resident, attending, round, residentEntry, attendingEntry } = await roundWithEntries()

    const attendingList = await listIds(attending.auth)
    const educatorList = await listIds(educator.auth)
    const attendingPull = await pulledIds(attending.auth)
    const residentList = await listIds(resident.auth)
    await closeRoundAs(app, educator.auth, round.id)

    expect(attendingList).toEqual([attendingEntry.id])
    expect(educatorList).toEqual([])
    expect(attendingPull).toEqual([attendingEntry.id])
    expect(residentList).toEqual([residentEntry.id])
    expect((await listIds(attending.auth)).sort()).toEqual([attendingEntry.id, residentEntry.id].sort())
    expect((await pulledIds(attending.auth)).sort()).toEqual([attendingEntry.id, residentEntry.id].sort())
    expect((await listIds(educator.auth)).length).toBe(2)
  })

  it('closing moves the entries past a device’s pull cursor, so a device that already synced receives them', async () => {
    const { educator, attending, round, residentEntry } = await roundWithEntries()
    const first = SyncPullResponseSchema.parse((await pull(app, attending.auth, 0)).body)

    await closeRoundAs(app, educator.auth, round.id)
    const next = SyncPullResponseSchema.parse((await pull(app, attending.auth, first.cursor)).body)

    expect(next.exams.map((e) => e.id)).toContain(residentEntry.id)
  })

  it('the team’s attending outside the round does not find a submitted entry in the sign-off queue until close', async () => {
    const { ward, educator, round, residentEntry } = await roundWithEntries()
    const wardAttending = await makeCaller({ roles: ['attending'], teamIds: [ward.id] })
    const queue = async () => (await request(app).get('/api/signoff-queue').set('Authorization', wardAttending.auth)).body.items.map((i: { exam: { id: string } }) => i.exam.id)

    const before = await queue()
    const read = await readAs(wardAttending.auth, residentEntry.id)
    await closeRoundAs(app, educator.auth, round.id)

    expect(before).toEqual([])
    expect(read.status).toBe(403) // could read it but for the blinding: told so, not 404
    expect(await queue()).toContain(residentEntry.id)
  })

  it('someone with no right to the exam at all still gets 404, so the entry’s existence is not disclosed', async () => {
    const { residentEntry } = await roundWithEntries()
    const stranger = await makeCaller({ roles: ['resident'] })

    expect((await readAs(stranger.auth, residentEntry.id)).status).toBe(404)
  })
})

describe('round entries and supervision pairs (server/agreement)', () => {
  it('round entries never form agreement pairs, before or after close; an ordinary exam of the same code pairs as usual', async () => {
    const { ward, educator, resident, attending, round } = await roundWithEntries()
    const pairs = async () => (await request(app).get('/api/agreement/pairs').set('Authorization', attending.auth)).body.total as number

    const before = await pairs()
    await closeRoundAs(app, educator.auth, round.id)
    const after = await pairs()
    const { recordSubmittedExam } = await import('../factories/exam.ts')
    await recordSubmittedExam(app, resident.auth, { teamId: ward.id, patientCode: 'SM-0777', heightCm: 2 })
    await recordSubmittedExam(app, attending.auth, { teamId: ward.id, patientCode: 'SM-0777', heightCm: 3 })

    expect(before).toBe(0)
    expect(after).toBe(0)
    expect(await pairs()).toBe(1)
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { SyncPushResponseSchema } from '#shared/schemas/sync'
import { ExamModel } from '../../../server/models/index.ts'
import { makeExamInput, recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { eventsOf } from '../supervision/ward.ts'
import { newExam, push, storedCounts } from './sync-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function residentOnTeam() {
  const team = await makeTeam()
  const resident = await makeCaller({ teamIds: [team.id] })
  return { team, resident }
}

describe('POST /api/sync/push', () => {
  it('stores a new exam as version 1 with one audit event and answers applied', async () => {
    const { team, resident } = await residentOnTeam()
    const change = newExam(team.id)

    const res = await push(app, resident.auth, [change])

    expect(res.status).toBe(200)
    expect(SyncPushResponseSchema.parse(res.body).results).toEqual([{ id: change.exam.id, result: 'applied', version: 1 }])
    const row = (await ExamModel.findByPk(change.exam.id))!
    expect(row).toMatchObject({ examinerId: resident.user.id, status: 'draft', version: 1, heightCm: 4 })
    // h = 4 cm at 45°, Seth offset 9.7 cm → 13.7 cmH₂O (Seth 2002 offset at 45°): the server computes it.
    expect(row.cvpCmH2O).toBeCloseTo(13.7, 5)
    expect(await storedCounts(change.exam.id)).toEqual({ rows: 1, events: 1 })
  })

  it('records the creation in the audit trail as the exams API does: the author, and every field from nothing', async () => {
    const { team, resident } = await residentOnTeam()
    const viaApi = await recordExam(app, resident.auth, { teamId: team.id })
    const viaSync = newExam(team.id)

    await push(app, resident.auth, [viaSync])

    const [apiEvent] = await eventsOf(viaApi.id, 'exam-create')
    const [syncEvent] = await eventsOf(viaSync.exam.id, 'exam-create')
    expect(syncEvent!.actorId).toBe(resident.user.id)
    expect(Object.keys(syncEvent!.changes!).sort()).toEqual(Object.keys(apiEvent!.changes!).sort())
    expect(syncEvent!.changes!.heightCm).toEqual({ from: null, to: 4 })
  })

  it('answers an identical push replayed as duplicate, keeping one row and one audit event', async () => {
    const { team, resident } = await residentOnTeam()
    const change = newExam(team.id)
    await push(app, resident.auth, [change])

    const replay = await push(app, resident.auth, [change])

    expect(replay.body.results).toEqual([{ id: change.exam.id, result: 'duplicate', version: 1 }])
    expect(await storedCounts(change.exam.id)).toEqual({ rows: 1, events: 1 })
  })

  it('treats the same record with its time in another offset and its keys reordered as a duplicate', async () => {
    const { team, resident } = await residentOnTeam()
    const change = newExam(team.id, { examinedAt: '2026-01-05T09:30:00.000Z' })
    await push(app, resident.auth, [change])
    const reordered = Object.fromEntries(Object.entries({ ...change.exam, examinedAt: '2026-01-05T10:30:00+01:00' }).reverse())

    const replay = await push(app, resident.auth, [{ exam: reordered as typeof change.exam, baseVersion: 0 }])

    expect(replay.body.results[0]).toMatchObject({ result: 'duplicate', version: 1 })
  })

  it('applies a change made on the current version as the next version', async () => {
    const { team, resident } = await residentOnTeam()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })

    const res = await push(app, resident.auth, [{ exam: { ...makeExamInput({ teamId: team.id }), id: exam.id, heightCm: 6 }, baseVersion: 1 }])

    expect(res.body.results).toEqual([{ id: exam.id, result: 'applied', version: 2 }])
    expect((await ExamModel.findByPk(exam.id))!.heightCm).toBe(6)
  })

  it('answers a change replayed after its answer was lost as duplicate, with no second version or audit event', async () => {
    const { team, resident } = await residentOnTeam()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    const change = { exam: { ...makeExamInput({ teamId: team.id }), id: exam.id, heightCm: 6 }, baseVersion: 1 }
    await push(app, resident.auth, [change])
    const before = await storedCounts(exam.id)

    const replay = await push(app, resident.auth, [change])

    expect(replay.body.results).toEqual([{ id: exam.id, result: 'duplicate', version: 2 }])
    expect(await storedCounts(exam.id)).toEqual(before)
  })

  it('answers a change based on a stale version with a conflict carrying the server copy, and writes nothing', async () => {
    const { team, resident } = await residentOnTeam()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', resident.auth).send({ heightCm: 2, baseVersion: 1 })
    const before = await storedCounts(exam.id)

    const res = await push(app, resident.auth, [{ exam: { ...makeExamInput({ teamId: team.id }), id: exam.id, heightCm: 6 }, baseVersion: 1 }])

    expect(res.body.results).toEqual([{ id: exam.id, result: 'conflict', exam: expect.objectContaining({ id: exam.id, version: 2, heightCm: 2 }) }])
    expect((await ExamModel.findByPk(exam.id))!).toMatchObject({ version: 2, heightCm: 2 })
    expect(await storedCounts(exam.id)).toEqual(before)
  })

  it('answers a batch mixing good, invalid and conflicting changes item by item, in the order sent', async () => {
    const { team, resident } = await residentOnTeam()
    const stale = await recordExam(app, resident.auth, { teamId: team.id })
    await request(app).patch(`/api/exams/${stale.id}`).set('Authorization', resident.auth).send({ notes: 'moved on', baseVersion: 1 })
    const [first, invalid, last] = [newExam(team.id), newExam(team.id, { inclinationDeg: 95 }), newExam(team.id)]
    const conflicting = { exam: { ...makeExamInput({ teamId: team.id }), id: stale.id }, baseVersion: 1 }

    const res = await push(app, resident.auth, [first!, invalid!, conflicting, last!])

    expect(res.body.results.map((r: { result: string }) => r.result)).toEqual(['applied', 'rejected', 'conflict', 'applied'])
    expect(res.body.results[1]).toMatchObject({ id: invalid!.exam.id, error: { code: 'invalid-input', fields: { inclinationDeg: 'Inclination is at most 90° (upright)' } } })
    expect(res.body.results[2].exam).toMatchObject({ id: stale.id, version: 2, notes: 'moved on' })
    expect(await ExamModel.count({ where: { id: [first!.exam.id, invalid!.exam.id, last!.exam.id] } })).toBe(2)
  })

  it('rejects a new exam filed to a team that is not the author’s, naming the field', async () => {
    const { resident } = await residentOnTeam()
    const elsewhere = await makeTeam()
    const change = newExam(elsewhere.id)

    const res = await push(app, resident.auth, [change])

    expect(res.body.results[0]).toMatchObject({ result: 'rejected', error: { fields: { teamId: 'Choose one of your own teams' } } })
    expect(await storedCounts(change.exam.id)).toEqual({ rows: 0, events: 0 })
  })

  it('rejects a change to an exam sent for countersignature, as locked, without blocking the rest', async () => {
    const { team, resident } = await residentOnTeam()
    const submitted = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    const change = { exam: { ...makeExamInput({ teamId: team.id }), id: submitted.id, heightCm: 9 }, baseVersion: submitted.version }
    const other = newExam(team.id)

    const res = await push(app, resident.auth, [change, other])

    expect(res.body.results[0]).toMatchObject({ result: 'rejected', error: { code: 'exam-locked' } })
    expect(res.body.results[1]).toMatchObject({ result: 'applied' })
  })

  it('never lets one author’s push reach another author’s exam', async () => {
    const { team, resident } = await residentOnTeam()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    const intruder = await makeCaller({ teamIds: [team.id] })
    const before = await storedCounts(exam.id)
    const copy = { ...makeExamInput({ teamId: team.id }), id: exam.id, notes: 'overwritten' }

    const res = await push(app, intruder.auth, [{ exam: copy, baseVersion: null }])
    const update = await push(app, intruder.auth, [{ exam: copy, baseVersion: 1 }])

    expect(res.body.results[0]).toMatchObject({ result: 'rejected', error: { code: 'id-taken' } })
    expect(update.body.results[0]).toMatchObject({ result: 'rejected', error: { code: 'exam-not-found' } })
    expect(await storedCounts(exam.id)).toEqual(before)
  })

  it('rejects a second change to the same exam within one batch', async () => {
    const { team, resident } = await residentOnTeam()
    const change = newExam(team.id)

    const res = await push(app, resident.auth, [change, change])

    expect(res.body.results.map((r: { result: string }) => r.result)).toEqual(['applied', 'rejected'])
    expect(res.body.results[1].error.code).toBe('repeated-in-batch')
  })

  it('answers 413 to more than 200 changes and stores none of them', async () => {
    const { team, resident } = await residentOnTeam()
    const changes = Array.from({ length: 201 }, () => newExam(team.id))

    const res = await push(app, resident.auth, changes)

    expect(res.status).toBe(413)
    expect(res.body.error.code).toBe('batch-too-large')
    expect(await ExamModel.count()).toBe(0)
  })

  it('answers 401 without a session and 403 to a role that does not record exams', async () => {
    const educator = await makeCaller({ roles: ['educator'] })

    const anonymous = await request(app).post('/api/sync/push').send({ changes: [] })
    const forbidden = await push(app, educator.auth, [])

    expect(anonymous.status).toBe(401)
    expect(forbidden.status).toBe(403)
  })
})

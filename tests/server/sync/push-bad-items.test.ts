import { beforeEach, describe, expect, it } from 'vitest'
import { SyncPushResponseSchema } from '#shared/schemas/sync'
import { ExamModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { newExam, push, storedCounts } from './sync-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function residentOnTeam() {
  const team = await makeTeam()
  return { team, resident: await makeCaller({ teamIds: [team.id] }) }
}

describe('POST /api/sync/push with one bad change among good ones', () => {
  it.each([
    ['an exam id holding a NUL character', { id: 'a\u0000b' }, 'id'],
    ['an exam id of 300 characters', { id: 'x'.repeat(300) }, 'id'],
    ['a round id holding a NUL character', { roundId: 'r\u0000' }, 'roundId'],
    ['a team id holding a NUL character', { teamId: 't\u0000' }, 'teamId'],
    ['notes holding a NUL character', { notes: 'a\u0000' }, 'notes'],
    ['an examination time in the year 50', { examinedAt: '0050-06-01T10:00:00Z' }, 'examinedAt'],
  ])('with %s, rejects that change naming the field and applies the 19 others', async (_case, overrides, field) => {
    const { team, resident } = await residentOnTeam()
    const good = Array.from({ length: 19 }, () => newExam(team.id))
    const bad = newExam(team.id, overrides as never)

    const res = await push(app, resident.auth, [...good.slice(0, 10), bad, ...good.slice(10)])

    expect(res.status).toBe(200)
    const results = SyncPushResponseSchema.parse(res.body).results
    expect(results[10]).toMatchObject({ result: 'rejected', error: { code: 'invalid-input', fields: { [field]: expect.any(String) } } })
    expect(results.filter((r) => r.result === 'applied')).toHaveLength(19)
    expect(await ExamModel.count({ where: { id: good.map((c) => c.exam.id) } })).toBe(19)
  })

  it('with a base version that is not a number, rejects that change naming baseVersion', async () => {
    const { team, resident } = await residentOnTeam()
    const good = newExam(team.id)
    const bad = { ...newExam(team.id), baseVersion: 'two' as never }

    const res = await push(app, resident.auth, [bad, good])

    expect(res.body.results[0]).toMatchObject({ result: 'rejected', error: { fields: { baseVersion: expect.any(String) } } })
    expect(res.body.results[1]).toMatchObject({ result: 'applied' })
  })
})

describe('POST /api/sync/push with UUIDs in upper case', () => {
  it('stores the exam under its lower-case id, and a replay in lower case is a duplicate', async () => {
    const { team, resident } = await residentOnTeam()
    const change = newExam(team.id)
    const upper = { ...change, exam: { ...change.exam, id: change.exam.id.toUpperCase() } }

    const first = await push(app, resident.auth, [upper])
    const replay = await push(app, resident.auth, [change])

    expect(first.body.results).toEqual([{ id: change.exam.id, result: 'applied', version: 1 }])
    expect(replay.body.results).toEqual([{ id: change.exam.id, result: 'duplicate', version: 1 }])
    expect(await storedCounts(change.exam.id)).toEqual({ rows: 1, events: 1 })
  })

  it('answers the same exam twice in one batch, once in each case, as repeated', async () => {
    const { team, resident } = await residentOnTeam()
    const change = newExam(team.id)
    const upper = { ...change, exam: { ...change.exam, id: change.exam.id.toUpperCase() } }

    const res = await push(app, resident.auth, [change, upper])

    expect(res.body.results.map((r: { result: string }) => r.result)).toEqual(['applied', 'rejected'])
    expect(await storedCounts(change.exam.id)).toEqual({ rows: 1, events: 1 })
  })
})

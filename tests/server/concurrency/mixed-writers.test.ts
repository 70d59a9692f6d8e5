import { Op } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema } from '#shared/schemas/exam'
import { SyncPushResponseSchema } from '#shared/schemas/sync'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { recordExam } from '../factories/exam.ts'
import { makeCaller, makeTeam } from '../helpers.ts'
import { startFileServer } from './file-server.ts'
import { EXAMS_PER_PUSH, mixedLoad, type LoadKind, type Outcome } from './mixed-load.ts'

let running: Awaited<ReturnType<typeof startFileServer>>

beforeEach(async () => {
  running = await startFileServer()
})

afterEach(async () => {
  await running.remove()
})

async function loadTarget() {
  const team = await makeTeam()
  const resident = await makeCaller({ teamIds: [team.id] })
  const base = await recordExam(running.url, resident.auth, { teamId: team.id })
  return { url: running.url, auth: resident.auth, teamId: team.id, base }
}

const ofKind = (outcomes: Outcome[], kind: LoadKind) => outcomes.filter((o) => o.kind === kind)

async function storedTimes(examIds: string[], action: string) {
  return {
    rows: await ExamModel.count({ where: { id: { [Op.in]: examIds } } }),
    events: await AuditEventModel.count({ where: { action, entityId: { [Op.in]: examIds } } }),
  }
}

// A hundred requests on two shared cores take a few seconds; the last in the queue waits for all before it.
describe('50 writers and 50 readers of the exam log at once, on a database file', { timeout: 60_000 }, () => {
  it('answers none of them with a 5xx, and every reader with the log', async () => {
    const target = await loadTarget()

    const outcomes = await mixedLoad(target, 50, 50)

    expect(outcomes).toHaveLength(100)
    expect(outcomes.filter((o) => o.status >= 500).map((o) => `${o.kind} ${o.status}`)).toEqual([])
    expect(ofKind(outcomes, 'read').map((o) => o.status)).toEqual(Array(50).fill(200))
  })

  it('stores every acknowledged new exam, from POST /api/exams and from sync pushes, exactly once with one audit event', async () => {
    const target = await loadTarget()

    const outcomes = await mixedLoad(target, 50, 50)

    const creates = ofKind(outcomes, 'create')
    const pushes = ofKind(outcomes, 'push')
    expect(creates.map((o) => o.status)).toEqual(Array(creates.length).fill(201))
    expect(pushes.map((o) => o.status)).toEqual(Array(pushes.length).fill(200))
    for (const push of pushes) {
      const results = SyncPushResponseSchema.parse(push.body).results
      expect(results.map((r) => [r.id, r.result])).toEqual(push.examIds.map((id) => [id, 'applied']))
    }
    const acknowledged = [...creates, ...pushes].flatMap((o) => o.examIds)
    expect(acknowledged).toHaveLength(creates.length + pushes.length * EXAMS_PER_PUSH)
    expect(await storedTimes(acknowledged, 'exam-create')).toEqual({ rows: acknowledged.length, events: acknowledged.length })
  })

  it('lets exactly one PATCH on the shared base version win; every other gets 409 stale-version with the winner’s copy', async () => {
    const target = await loadTarget()

    const patches = ofKind(await mixedLoad(target, 50, 50), 'patch')

    const winners = patches.filter((o) => o.status === 200)
    expect(winners).toHaveLength(1)
    const winner = ExamSchema.parse(winners[0]!.body)
    expect(winner).toMatchObject({ version: target.base.version + 1, notes: winners[0]!.notes })
    const losers = patches.filter((o) => o.status !== 200)
    expect(losers.map((o) => o.status)).toEqual(Array(patches.length - 1).fill(409))
    for (const loser of losers) {
      const body = loser.body as { error: { code: string }; exam: unknown }
      expect(body.error.code).toBe('stale-version')
      expect(ExamSchema.parse(body.exam)).toMatchObject({ id: target.base.id, version: winner.version, notes: winner.notes })
    }
    expect((await ExamModel.findByPk(target.base.id))!.toJSON()).toMatchObject({ version: winner.version, notes: winner.notes })
    expect(await storedTimes([target.base.id], 'exam-update')).toEqual({ rows: 1, events: 1 })
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { SignoffQueueSchema } from '#shared/schemas/signoff-queue'
import { ExamModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const HOUR_MS = 60 * 60 * 1000

/** Submits an exam and backdates its submission, so the order does not hang on milliseconds. */
async function submittedHoursAgo(auth: string, teamId: string, hoursAgo: number, patientCode = 'SM-0142') {
  const exam = await recordSubmittedExam(app, auth, { teamId, patientCode })
  await ExamModel.update({ submittedAt: new Date(Date.now() - hoursAgo * HOUR_MS) }, { where: { id: exam.id } })
  return exam
}

async function queueAs(auth: string, query: Record<string, number | string> = {}) {
  const res = await request(app).get('/api/signoff-queue').set('Authorization', auth).query(query)
  return { res, queue: res.status === 200 ? SignoffQueueSchema.parse(res.body) : null }
}

describe('GET /api/signoff-queue', () => {
  it('lists the ward’s submitted exams, the longest-waiting first, with how long each has waited', async () => {
    const { team, resident, attending } = await makeWard()
    const recent = await submittedHoursAgo(resident.auth, team.id, 1, 'SM-0157')
    const oldest = await submittedHoursAgo(resident.auth, team.id, 5, 'SM-0142')

    const { queue } = await queueAs(attending.auth)

    expect(queue!.items.map((i) => [i.exam.id, i.exam.patientCode])).toEqual([
      [oldest.id, 'SM-0142'],
      [recent.id, 'SM-0157'],
    ])
    expect(queue!.items[0]!.waitingSeconds).toBeGreaterThanOrEqual(5 * 3600)
    expect(queue!.items[0]!.exam.estimate.cvpCmH2O).toBeCloseTo(13.7, 2)
    expect(queue!.total).toBe(2)
  })

  it('leaves out drafts, returned and countersigned exams, other wards’ exams and the attending’s own', async () => {
    const { team, resident, attending } = await makeWard()
    const colleague = await makeCaller({ roles: ['attending'], teamIds: [team.id], withPassword: true })
    const waiting = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await recordExam(app, resident.auth, { teamId: team.id })
    await act(app, colleague.auth, await recordSubmittedExam(app, resident.auth, { teamId: team.id }), 'return', { comment: 'Redo' })
    await act(app, colleague.auth, await recordSubmittedExam(app, resident.auth, { teamId: team.id }), 'countersign', SIGN)
    await recordSubmittedExam(app, attending.auth, { teamId: team.id })
    const amu = await makeTeam('Acute Medical Unit')
    await recordSubmittedExam(app, (await makeCaller({ teamIds: [amu.id] })).auth, { teamId: amu.id })

    const { queue } = await queueAs(attending.auth)

    expect(queue!.items.map((i) => i.exam.id)).toEqual([waiting.id])
  })

  it('pages the queue and reports the total', async () => {
    const { team, resident, attending } = await makeWard()
    for (const hours of [3, 2, 1]) await submittedHoursAgo(resident.auth, team.id, hours)

    const { queue } = await queueAs(attending.auth, { page: 2, pageSize: 2 })

    expect(queue).toMatchObject({ total: 3, page: 2, pageSize: 2 })
    expect(queue!.items).toHaveLength(1)
  })

  it('pages on with the cursor: a newer submission waits at the end, and none is skipped or repeated', async () => {
    const { team, resident, attending } = await makeWard()
    const waiting = []
    for (const hours of [5, 4, 4, 3, 2]) waiting.push(await submittedHoursAgo(resident.auth, team.id, hours))
    const first = await queueAs(attending.auth, { pageSize: 2 })
    const newer = await submittedHoursAgo(resident.auth, team.id, 0.5)

    const seen = first.queue!.items.map((i) => i.exam.id)
    for (let cursor = first.queue!.nextCursor, page = 2; cursor; page++) {
      const { queue } = await queueAs(attending.auth, { pageSize: 2, page, cursor })
      seen.push(...queue!.items.map((i) => i.exam.id))
      cursor = queue!.nextCursor
    }

    expect(seen.slice(0, 5).sort()).toEqual(waiting.map((e) => e.id).sort())
    expect(seen.slice(0, 2)).toEqual([waiting[0]!.id, expect.any(String)])
    expect(seen).toEqual([...new Set(seen)])
    expect(seen.at(-1)).toBe(newer.id)
    expect(first.queue!.total).toBe(5)
  })

  it('when the cursor is not one the queue made, responds 400 naming the cursor', async () => {
    const { attending } = await makeWard()

    const { res } = await queueAs(attending.auth, { cursor: 'nonsense' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('cursor')
  })

  it('answers 403 to a resident, an educator and an admin', async () => {
    const { team } = await makeWard()
    const callers = [await makeCaller({ teamIds: [team.id] }), await makeCaller({ roles: ['educator'] }), await makeCaller({ roles: ['admin'] })]

    const statuses = await Promise.all(callers.map(async (c) => (await queueAs(c.auth)).res.status))

    expect(statuses).toEqual([403, 403, 403])
  })
})

describe('GET /api/signoff-queue/count', () => {
  it('counts what waits for the attending, for a badge', async () => {
    const { team, resident, attending } = await makeWard()
    await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await recordExam(app, resident.auth, { teamId: team.id })

    const res = await request(app).get('/api/signoff-queue/count').set('Authorization', attending.auth)

    expect(res.status).toBe(200)
    expect(res.body).toEqual({ count: 2 })
  })

  it('answers 403 to a resident', async () => {
    const resident = await makeCaller()

    const res = await request(app).get('/api/signoff-queue/count').set('Authorization', resident.auth)

    expect(res.status).toBe(403)
  })
})

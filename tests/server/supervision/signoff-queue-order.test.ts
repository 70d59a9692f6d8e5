import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { SignoffQueueResidentsSchema, SignoffQueueSchema } from '#shared/schemas/signoff-queue'
import { ExamModel } from '../../../server/models/index.ts'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { makeWard } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const HOUR_MS = 60 * 60 * 1000

const NOW = Date.now()

/** Submits an exam and backdates its submission from one fixed instant, so equal hours are equal times (ties). */
async function submittedHoursAgo(auth: string, teamId: string, hoursAgo: number, patientCode = 'SM-0142') {
  const exam = await recordSubmittedExam(app, auth, { teamId, patientCode })
  await ExamModel.update({ submittedAt: new Date(NOW - hoursAgo * HOUR_MS) }, { where: { id: exam.id } })
  return exam
}

async function queueAs(auth: string, query: Record<string, number | string> = {}) {
  const res = await request(app).get('/api/signoff-queue').set('Authorization', auth).query(query)
  return { res, queue: res.status === 200 ? SignoffQueueSchema.parse(res.body) : null }
}

/** Every page by cursor from the first: the ids in the order the pages gave them. */
async function walk(auth: string, query: Record<string, number | string>, between?: () => Promise<unknown>) {
  const first = await queueAs(auth, query)
  await between?.()
  const seen = first.queue!.items.map((i) => i.exam.id)
  for (let cursor = first.queue!.nextCursor, page = 2; cursor; page++) {
    const { queue } = await queueAs(auth, { ...query, page, cursor })
    seen.push(...queue!.items.map((i) => i.exam.id))
    cursor = queue!.nextCursor
  }
  return seen
}

describe('GET /api/signoff-queue?order=', () => {
  it('with order=newest, lists the latest submission first', async () => {
    const { team, resident, attending } = await makeWard()
    const older = await submittedHoursAgo(resident.auth, team.id, 5)
    const newer = await submittedHoursAgo(resident.auth, team.id, 1)

    const { queue } = await queueAs(attending.auth, { order: 'newest' })

    expect(queue!.items.map((i) => i.exam.id)).toEqual([newer.id, older.id])
  })

  it.each(['oldest', 'newest'])(
    'with order=%s, pages by cursor through ties of submission time with none skipped or repeated',
    async (order) => {
      const { team, resident, attending } = await makeWard()
      const exams = []
      for (const hours of [6, 5, 5, 5, 4, 3, 3]) exams.push({ hours, id: (await submittedHoursAgo(resident.auth, team.id, hours)).id })

      const seen = await walk(attending.auth, { pageSize: 2, order })

      const byTime = [...exams].sort((a, b) => b.hours - a.hours || (a.id < b.id ? -1 : 1)).map((e) => e.id)
      expect(seen).toEqual(order === 'oldest' ? byTime : byTime.reverse())
    },
  )

  it('with order=newest, a submission made while paging is not repeated and none already waiting is skipped', async () => {
    const { team, resident, attending } = await makeWard()
    const waiting = []
    for (const hours of [5, 4, 3, 2, 1]) waiting.push((await submittedHoursAgo(resident.auth, team.id, hours)).id)

    const seen = await walk(attending.auth, { pageSize: 2, order: 'newest' }, () => submittedHoursAgo(resident.auth, team.id, 0.1))

    expect(seen).toEqual([...waiting].reverse())
  })

  it('when the cursor was made in the other order, responds 400 naming the cursor', async () => {
    const { team, resident, attending } = await makeWard()
    for (const hours of [3, 2, 1]) await submittedHoursAgo(resident.auth, team.id, hours)
    const { queue } = await queueAs(attending.auth, { pageSize: 1, order: 'oldest' })

    const { res } = await queueAs(attending.auth, { pageSize: 1, order: 'newest', cursor: queue!.nextCursor! })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('cursor')
  })

  it('when the order is neither newest nor oldest, responds 400 naming the order', async () => {
    const { attending } = await makeWard()

    const { res } = await queueAs(attending.auth, { order: 'sideways' })

    expect(res.status).toBe(400)
    expect(res.body.error).toMatchObject({ code: expect.any(String), fields: { order: expect.any(String) } })
  })
})

describe('GET /api/signoff-queue?q=', () => {
  it('finds the exams whose patient code or resident’s name contains the text, without case', async () => {
    const { team, resident, attending } = await makeWard()
    const other = await makeCaller({ teamIds: [team.id], displayName: 'Dr Ayo Okafor' })
    const byCode = await submittedHoursAgo(resident.auth, team.id, 3, 'OKA-7')
    const byName = await submittedHoursAgo(other.auth, team.id, 2, 'SM-0001')
    await submittedHoursAgo(resident.auth, team.id, 1, 'SM-0002')

    const { queue } = await queueAs(attending.auth, { q: 'oKa' })

    expect(queue!.items.map((i) => i.exam.id)).toEqual([byCode.id, byName.id])
    expect(queue!.total).toBe(2)
  })

  it('matches % and _ in a name only as themselves', async () => {
    const { team, attending } = await makeWard()
    const names = ['Dr Li_Wei', 'Dr LiXWei', 'Dr 50% Jones', 'Dr 50 Jones']
    for (const [i, displayName] of names.entries()) {
      const examiner = await makeCaller({ teamIds: [team.id], displayName })
      await submittedHoursAgo(examiner.auth, team.id, 5 - i)
    }

    const underscore = await queueAs(attending.auth, { q: 'i_w' })
    const percent = await queueAs(attending.auth, { q: '50%' })

    expect(underscore.queue!.items.map((i) => i.exam.examinerName)).toEqual(['Dr Li_Wei'])
    expect(percent.queue!.items.map((i) => i.exam.examinerName)).toEqual(['Dr 50% Jones'])
  })

  it('with a blank search, lists the whole queue', async () => {
    const { team, resident, attending } = await makeWard()
    await submittedHoursAgo(resident.auth, team.id, 2, 'SM-0001')
    await submittedHoursAgo(resident.auth, team.id, 1, 'SM-0002')

    const { queue } = await queueAs(attending.auth, { q: '   ' })

    expect(queue!.total).toBe(2)
  })

  it('when the search is longer than 100 characters, responds 400 naming q', async () => {
    const { attending } = await makeWard()

    const { res } = await queueAs(attending.auth, { q: 'x'.repeat(101) })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('q')
  })

  it('pages a search by cursor newest first without skipping or repeating', async () => {
    const { team, resident, attending } = await makeWard()
    const matching = []
    for (const hours of [6, 5, 4, 3, 2]) matching.push((await submittedHoursAgo(resident.auth, team.id, hours, `BED-${hours}`)).id)
    for (const hours of [5.5, 4.5, 3.5]) await submittedHoursAgo(resident.auth, team.id, hours, `SM-${hours * 10}`)

    const seen = await walk(attending.auth, { pageSize: 2, order: 'newest', q: 'bed' })

    expect(seen).toEqual([...matching].reverse())
  })
})

describe('GET /api/signoff-queue?residentId=', () => {
  it('lists only that resident’s waiting exams', async () => {
    const { team, resident, attending } = await makeWard()
    const other = await makeCaller({ teamIds: [team.id], displayName: 'Dr Ayo Okafor' })
    const theirs = await submittedHoursAgo(other.auth, team.id, 2)
    await submittedHoursAgo(resident.auth, team.id, 1)

    const { queue } = await queueAs(attending.auth, { residentId: other.user.id })

    expect(queue!.items.map((i) => i.exam.id)).toEqual([theirs.id])
  })

  it('when the resident id is empty, responds 400 naming residentId', async () => {
    const { attending } = await makeWard()

    const { res } = await queueAs(attending.auth, { residentId: '' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('residentId')
  })
})

describe('GET /api/signoff-queue/residents', () => {
  it('counts each resident’s waiting exams, by name', async () => {
    const { team, resident, attending } = await makeWard()
    const other = await makeCaller({ teamIds: [team.id], displayName: 'Dr Ayo Okafor' })
    for (const hours of [3, 2]) await submittedHoursAgo(resident.auth, team.id, hours)
    await submittedHoursAgo(other.auth, team.id, 1)
    await submittedHoursAgo(attending.auth, team.id, 1)

    const res = await request(app).get('/api/signoff-queue/residents').set('Authorization', attending.auth)

    expect(res.status).toBe(200)
    expect(SignoffQueueResidentsSchema.parse(res.body).residents).toEqual([
      { residentId: other.user.id, name: 'Dr Ayo Okafor', count: 1 },
      { residentId: resident.user.id, name: 'Dr Sam Whitcombe', count: 2 },
    ])
  })

  it('answers 403 to a resident', async () => {
    const resident = await makeCaller()

    const res = await request(app).get('/api/signoff-queue/residents').set('Authorization', resident.auth)

    expect(res.status).toBe(403)
  })
})

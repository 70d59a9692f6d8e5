import { randomUUID } from 'node:crypto'
import bcrypt from 'bcryptjs'
import request from 'supertest'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import type { Exam } from '#shared/schemas/exam'
import type { SyncChangeInput, SyncPullResponse, SyncResult } from '#shared/schemas/sync'
import { BCRYPT_COST } from '../../../server/auth/passwords.ts'
import { makeExamInput } from '../factories/exam.ts'
import { PASSWORD } from '../helpers.ts'
import { sharedDatabase, startAppServer, tempFolder, type AppServer } from './app-servers.ts'

// Two app servers, each with its own modules and its own connection to one database, as behind a load balancer that
// sends a device's requests to either. On SQLite now; TEST_DATABASE_URL (app-servers.ts) runs the same on PostgreSQL.

let folder: ReturnType<typeof tempFolder>
let one: AppServer
let two: AppServer

beforeEach(async () => {
  folder = tempFolder()
  const location = await sharedDatabase(folder.dir)
  one = await startAppServer(location)
  two = await startAppServer(location)
  // Each its own modules, as two processes: nothing is shared but the database.
  if (one.models.ExamModel === two.models.ExamModel) throw new Error('the two servers share their modules')
})

afterEach(async () => {
  await one.close()
  await two.close()
  folder.remove()
})

/** A ward written through the first server's models: a team, a resident and an attending who sign in with PASSWORD. */
async function makeWard() {
  const { TeamModel, UserModel, MembershipModel } = one.models
  const team = await TeamModel.create({ id: randomUUID(), name: `Ward ${randomUUID().slice(0, 8)}` })
  const passwordHash = await bcrypt.hash(PASSWORD, BCRYPT_COST)
  const person = async (roles: ('resident' | 'attending')[]) => {
    const user = await UserModel.create({
      id: randomUUID(),
      email: `${randomUUID().slice(0, 8)}@example.test`,
      displayName: 'Dr Test',
      passwordHash,
      roles,
      active: true,
    })
    await MembershipModel.create({ userId: user.id, teamId: team.id })
    return user
  }
  return { teamId: team.id, resident: await person(['resident']), attending: await person(['attending']) }
}

async function signInAt(server: AppServer, email: string): Promise<string> {
  const res = await request(server.url).post('/api/auth/login').send({ email, password: PASSWORD })
  expect(res.status).toBe(200)
  return `Bearer ${res.body.token as string}`
}

async function push(server: AppServer, auth: string, changes: SyncChangeInput[]): Promise<SyncResult[]> {
  const res = await request(server.url).post('/api/sync/push').set('Authorization', auth).send({ changes })
  expect(res.status).toBe(200)
  return res.body.results as SyncResult[]
}

/** Every page of the pull from `cursor` on, `limit` exams a page. */
async function pullAll(server: AppServer, auth: string, cursor = 0, limit = 5): Promise<SyncPullResponse[]> {
  const pages: SyncPullResponse[] = []
  for (let more = true; more;) {
    const res = await request(server.url).get('/api/sync/pull').query({ cursor, limit }).set('Authorization', auth)
    expect(res.status).toBe(200)
    const page = res.body as SyncPullResponse
    pages.push(page)
    ;({ cursor, more } = page)
  }
  return pages
}

const idsOf = (pages: SyncPullResponse[]) => pages.flatMap((page) => page.exams.map((exam) => exam.id))

describe('two app servers on one database: sync', () => {
  it('an outbox pushed half to each server at once is pulled from the other whole, each exam once, in cursor order', async () => {
    const ward = await makeWard()
    const auth = await signInAt(one, ward.resident.email)
    const outbox = Array.from({ length: 24 }, (_, i) => ({
      exam: makeExamInput({ teamId: ward.teamId, patientCode: `SM-${1000 + i}` }),
      baseVersion: null,
    }))
    const [first, second] = [outbox.slice(0, 12), outbox.slice(12)]

    const [toOne, toTwo] = await Promise.all([push(one, auth, first), push(two, auth, second)])
    // The device never heard the first answer and sends that half again, now to the other server.
    const retried = await push(two, auth, first)
    const fromTwo = await pullAll(two, auth)
    const fromOne = await pullAll(one, auth)

    expect([...toOne, ...toTwo].map((r) => r.result)).toEqual(new Array(24).fill('applied'))
    expect(retried.map((r) => r.result)).toEqual(new Array(12).fill('duplicate'))
    expect(idsOf(fromTwo).sort()).toEqual(outbox.map((c) => c.exam.id).sort())
    expect(idsOf(fromOne)).toEqual(idsOf(fromTwo))
    const cursors = fromTwo.map((page) => page.cursor)
    expect(cursors).toEqual([...cursors].sort((a, b) => a - b))
    expect(new Set(cursors.slice(0, -1)).size).toBe(cursors.length - 1)
    expect(await one.models.ExamModel.count({ where: { examinerId: ward.resident.id } })).toBe(24)
  })

  it('an exam submitted through one server and countersigned through the other reads as signed on the first, and comes once more in its pull', async () => {
    const ward = await makeWard()
    const [residentAuth, attendingAuth] = [await signInAt(one, ward.resident.email), await signInAt(two, ward.attending.email)]
    const exam = makeExamInput({ teamId: ward.teamId })
    await push(one, residentAuth, [{ exam, baseVersion: null }])
    const submitted = await request(one.url)
      .post(`/api/exams/${exam.id}/submit`)
      .set('Authorization', residentAuth)
      .send({ baseVersion: 1 })
    const before = (await pullAll(one, residentAuth)).at(-1)!.cursor

    const signed = await request(two.url)
      .post(`/api/exams/${exam.id}/countersign`)
      .set('Authorization', attendingAuth)
      .send({ password: PASSWORD, meaning: 'reviewed-agree' })
    const read = await request(one.url).get(`/api/exams/${exam.id}`).set('Authorization', residentAuth)
    const pulled = (await pullAll(one, residentAuth, before)).flatMap((page) => page.exams)

    expect(submitted.status).toBe(200)
    expect(signed.status).toBe(200)
    expect((read.body as Exam).status).toBe('countersigned')
    expect((read.body as Exam).signatures).toHaveLength(1)
    expect(pulled.map((e) => [e.id, e.status])).toEqual([[exam.id, 'countersigned']])
  })
})

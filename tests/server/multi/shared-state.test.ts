import request from 'supertest'
import type { Sequelize } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { initModels } from '../../../server/models/index.ts'
import { DAY, MINUTE, storeExam } from '../agreement/factories.ts'
import { makeTeam, makeUser, PASSWORD } from '../helpers.ts'
import { settingsWith } from '../settings/settings-calls.ts'
import { sharedDatabase, startAppServer, tempFolder, type AppServer } from './app-servers.ts'

// What each app server used to keep in its own memory, now read through the database they share. The test's own
// modules are a third connection, writing rows as another server would, behind the two servers' backs.

let folder: ReturnType<typeof tempFolder>
let own: Sequelize
let one: AppServer
let two: AppServer

beforeEach(async () => {
  folder = tempFolder()
  const location = await sharedDatabase(folder.dir)
  one = await startAppServer(location)
  two = await startAppServer(location)
  own = openDatabase(location)
  initModels(own)
})

afterEach(async () => {
  await one.close()
  await two.close()
  await own.close()
  folder.remove()
})

async function signInAt(server: AppServer, email: string): Promise<string> {
  const res = await request(server.url).post('/api/auth/login').send({ email, password: PASSWORD })
  return `Bearer ${res.body.token as string}`
}

const settingsAt = (server: AppServer, auth: string) => request(server.url).get('/api/settings').set('Authorization', auth)

describe('sign-in attempts on two servers', () => {
  it('failures sent to either server count against one limit: the 11th in 15 minutes answers 429', async () => {
    const user = await makeUser()

    const statuses: number[] = []
    for (let i = 0; i < 11; i++) {
      const server = i % 2 ? two : one
      statuses.push((await request(server.url).post('/api/auth/login').send({ email: user.email, password: 'wrong' })).status)
    }

    expect(statuses).toEqual([...new Array(10).fill(401), 429])
  })
})

describe('settings saved through one server', () => {
  it('are in force on the other from its next request', async () => {
    const [admin, reader] = [await makeUser({ roles: ['admin'] }), await makeUser()]
    const [adminAuth, readerAuth] = [await signInAt(one, admin.email), await signInAt(two, reader.email)]
    const before = (await settingsAt(two, readerAuth)).body

    const saved = await request(one.url)
      .put('/api/admin/settings')
      .set('Authorization', adminAuth)
      .send({ ...settingsWith({ pairWindowMinutes: 90 }), baseVersion: before.version })
    const after = (await settingsAt(two, readerAuth)).body

    expect(saved.status).toBe(200)
    expect(after.version).toBe(before.version + 1)
    expect(after.values.pairWindowMinutes).toBe(90)
  })
})

describe('the local error term', () => {
  it('computed on one server follows pairs another server recorded, from its next request', async () => {
    const reader = await makeUser()
    const readerAuth = await signInAt(two, reader.email)
    const before = (await settingsAt(two, readerAuth)).body

    await storePairs(30)
    const after = (await settingsAt(two, readerAuth)).body

    expect(before.observerTerm.source).toBe('default')
    expect(after.observerTerm.source).toBe('local-pairs')
  })
})

/** Resident–attending pairs a day apart, 30 minutes between the two readings, written as a third server would. */
async function storePairs(count: number) {
  const team = await makeTeam()
  const resident = await makeUser({ teamIds: [team.id], withPassword: false })
  const attending = await makeUser({ roles: ['attending'], teamIds: [team.id], withPassword: false })
  for (let i = 0; i < count; i++) {
    const at = Date.now() - (i + 1) * DAY
    const common = { teamId: team.id, patientCode: `SM-${2000 + i}` }
    await storeExam({ ...common, examinerId: resident.id, at, heightCm: i % 2 ? 2 : 6 })
    await storeExam({ ...common, examinerId: attending.id, at: at + 30 * MINUTE, heightCm: 4 })
  }
}

import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { pino } from 'pino'
import { afterEach, describe, expect, it } from 'vitest'
import { derivePairs } from '../../../server/agreement/pair-derivation.ts'
import { createApp } from '../../../server/app.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { ExamModel, initModels } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp, sharedTestDatabase, TEST_SECRET } from '../helpers.ts'
import { DAY, examValues, MINUTE, pairsAs, storeExam, summaryAs, trendAs } from './factories.ts'

const T0 = Date.now() - 30 * DAY
const cleanups: (() => Promise<void>)[] = []

afterEach(async () => {
  for (const cleanup of cleanups.splice(0)) await cleanup()
})

/**
 * One database (a SQLite file, or on PostgreSQL a database of its own) and two connections to it: the app's, and another app server's, which derives pairs in its own
 * transactions. Nothing tells the app about the other server's writes but the table itself.
 */
async function sharedDatabase() {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-agreement-'))
  const file = await sharedTestDatabase(dir)
  const sequelize = openDatabase(file)
  const models = initModels(sequelize)
  const other = openDatabase(file)
  cleanups.push(async () => {
    await other.close()
    await sequelize.close()
    rmSync(dir, { recursive: true, force: true })
  })
  const log = pino({ level: 'silent' })
  const app = createApp({ sequelize, models, secret: TEST_SECRET, log, demo: false, cookieSecure: false, baseUrl: 'https://plumbline.test' })
  return { app, other }
}

async function residentAndAttending() {
  const team = await makeTeam()
  const [resident, attending] = [await makeCaller({ teamIds: [team.id] }), await makeCaller({ roles: ['attending'], teamIds: [team.id] })]
  const exam = (who: typeof resident, patientCode: string, minutes: number, heightCm: number) =>
    examValues({ examinerId: who.user.id, teamId: team.id, patientCode, at: T0 + minutes * MINUTE, heightCm })
  return { resident, attending, educator: await makeCaller({ roles: ['educator'] }), exam }
}

describe('agreement reads ask agreement_pairs every time', () => {
  it('a pair another app server derived on the same database shows in the next summary, trend and list', async () => {
    const { app, other } = await sharedDatabase()
    const { resident, attending, educator, exam } = await residentAndAttending()
    await storeExam({ examinerId: resident.user.id, teamId: (await makeTeam()).id, patientCode: 'SM-0100', at: T0, heightCm: 5 })
    const before = await summaryAs(app, educator.auth)
    const rows = [exam(resident, 'SM-0142', 0, 3), exam(attending, 'SM-0142', 30, 5)]
    await ExamModel.bulkCreate(rows)

    await other.transaction((transaction) => derivePairs(['SM-0142'], { sequelize: other, transaction }))

    const after = await summaryAs(app, educator.auth)
    const { trend } = await trendAs(app, educator.auth)
    const { list } = await pairsAs(app, educator.auth)
    expect(before.summary!.n).toBe(0)
    expect(after.summary!.n).toBe(1)
    expect(trend!.months.map((m) => [m.n, m.bias])).toEqual([[1, -2]])
    expect(list!.pairs.map((p) => [p.first.examId, p.second.examId])).toEqual([rows.map((r) => r.id)])
  })

  it('a change to a paired exam shows in the very next read', async () => {
    const { app } = await makeTestApp()
    const { resident, attending, educator } = await residentAndAttending()
    const team = await makeTeam()
    const changed = await storeExam({ examinerId: resident.user.id, teamId: team.id, patientCode: 'SM-0157', at: T0, heightCm: 2 })
    await storeExam({ examinerId: attending.user.id, teamId: team.id, patientCode: 'SM-0157', at: T0 + 30 * MINUTE, heightCm: 4 })
    const before = await pairsAs(app, educator.auth)

    await ExamModel.sequelize!.transaction(async (transaction) => {
      await ExamModel.update({ verticalHeightCm: 3 }, { where: { id: changed.id }, transaction })
      await derivePairs([changed.patientCode], { sequelize: ExamModel.sequelize!, transaction })
    })

    const after = await pairsAs(app, educator.auth)
    expect(before.list!.pairs[0]!.differenceCm).toBe(-2)
    expect(after.list!.pairs[0]!.differenceCm).toBe(-1)
  })

  it('a derivation that rolls back leaves the summary as it was', async () => {
    const { app, sequelize } = await makeTestApp()
    const { resident, attending, educator } = await residentAndAttending()
    const team = await makeTeam()
    const exam = await storeExam({ examinerId: resident.user.id, teamId: team.id, patientCode: 'SM-0171', at: T0, heightCm: 2 })
    await storeExam({ examinerId: attending.user.id, teamId: team.id, patientCode: 'SM-0171', at: T0 + 30 * MINUTE, heightCm: 4 })

    const failed = sequelize.transaction(async (transaction) => {
      await ExamModel.update({ verticalHeightCm: 3 }, { where: { id: exam.id }, transaction })
      await derivePairs([exam.patientCode], { sequelize, transaction })
      throw new Error('rolled back')
    })

    await expect(failed).rejects.toThrow('rolled back')
    const { list } = await pairsAs(app, educator.auth)
    expect(list!.pairs[0]!.differenceCm).toBe(-2)
  })
})

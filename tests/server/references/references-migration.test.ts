import type { Sequelize } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { createMigrator, migrationNames } from '../../../server/db/migrator.ts'
import { ExamModel, initModels } from '../../../server/models/index.ts'
import { DAY, examValues } from '../agreement/factories.ts'
import { makeCaller, makeTeam, openBlankDatabase } from '../helpers.ts'

const MIGRATION = '2026.12.11T11.00.00.references'
const BEFORE = migrationNames[migrationNames.indexOf(MIGRATION) - 1]!
let sequelize: Sequelize

beforeEach(async () => {
  sequelize = await openBlankDatabase()
  initModels(sequelize)
})

afterEach(async () => {
  await sequelize.close()
})

interface Stored {
  id: string
  estimate: string
  syncSeq: number
  bandLowCmH2O: number | null
  bandHighCmH2O: number | null
}

const examsNow = () => sequelize.query<Stored>('SELECT * FROM "exams" ORDER BY "id"', { type: QueryTypes.SELECT })

describe(`migration ${MIGRATION}`, () => {
  it('on up, copies each stored estimate’s band into its columns without moving the sync cursor', async () => {
    const migrator = createMigrator(sequelize)
    await migrator.up()
    const team = await makeTeam()
    const { user } = await makeCaller({ teamIds: [team.id] })
    const at = Date.now() - DAY
    await ExamModel.create(examValues({ examinerId: user.id, teamId: team.id, at }))
    await ExamModel.create(
      examValues({ examinerId: user.id, teamId: team.id, at, findings: { columnTop: 'not-filled', heightCm: null, inclinationDeg: 0 } }),
    )
    await migrator.down({ to: BEFORE })
    const before = await examsNow()

    await migrator.up()
    const after = await examsNow()

    expect(before.every((e) => !('bandLowCmH2O' in e))).toBe(true)
    expect(after.map((e) => [e.bandLowCmH2O, e.bandHighCmH2O])).toEqual(before.map((e) => JSON.parse(e.estimate).bandCmH2O))
    expect(after.some((e) => e.bandLowCmH2O === null && e.bandHighCmH2O !== null)).toBe(true)
    expect(after.map((e) => e.syncSeq)).toEqual(before.map((e) => e.syncSeq))
  })
})

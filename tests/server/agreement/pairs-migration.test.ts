import type { Sequelize } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { createMigrator } from '../../../server/db/migrator.ts'
import { ExamModel, initModels } from '../../../server/models/index.ts'
import { isSqlite } from '../database-kind.ts'
import { makeCaller, makeTeam, openBlankDatabase } from '../helpers.ts'
import { DAY, MINUTE, examValues } from './factories.ts'

const MIGRATION = '2026.12.08T09.00.00.agreement-pairs-table'
let sequelize: Sequelize

beforeEach(async () => {
  sequelize = await openBlankDatabase()
})

afterEach(async () => {
  await sequelize.close()
})

/**
 * Exams stored before the pairs table existed: one resident–attending pair and an exam with no partner. They are
 * written on the current schema, then the migrations are taken back to just before the pairs table, which leaves the
 * rows in place without their pairs.
 */
async function examsOfOldRelease(migrator: ReturnType<typeof createMigrator>) {
  await migrator.up()
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  const at = Date.now() - 10 * DAY
  const exam = (examinerId: string, minutes: number, patientCode: string) =>
    ExamModel.create(examValues({ examinerId, teamId: team.id, at: at + minutes * MINUTE, patientCode }))
  const paired = [await exam(resident.user.id, 0, 'SM-0142'), await exam(attending.user.id, 40, 'SM-0142')]
  await exam(resident.user.id, 0, 'SM-0157')
  await migrator.down({ to: MIGRATION })
  return paired.map((e) => e.id)
}

const storedPairs = () =>
  sequelize.query<{ earlierExamId: string; laterExamId: string }>('SELECT "earlierExamId", "laterExamId" FROM "agreement_pairs"', {
    type: QueryTypes.SELECT,
  })
const tables = async () => (await sequelize.getQueryInterface().showAllTables()) as string[]
const examIndexes = async () => ((await sequelize.getQueryInterface().showIndex('exams')) as { name: string }[]).map((i) => i.name)

describe(`migration ${MIGRATION}`, () => {
  it('on up, pairs the exams already stored; down drops the table and brings back the index it replaced', async () => {
    initModels(sequelize)
    const migrator = createMigrator(sequelize)
    const paired = await examsOfOldRelease(migrator)

    await migrator.up()
    const pairs = await storedPairs()
    const indexesAfterUp = await examIndexes()
    await migrator.down({ to: MIGRATION })
    const tablesAfterDown = await tables()
    const indexesAfterDown = await examIndexes()
    await migrator.up()

    expect(pairs.map((p) => [p.earlierExamId, p.laterExamId])).toEqual([paired])
    expect(indexesAfterUp).not.toContain('exams_agreement_pairs')
    expect(tablesAfterDown).not.toContain('agreement_pairs')
    // The packed index read SQLite's own functions; PostgreSQL never had it (2026.12.05T09.00.00.agreement-pairs).
    expect(indexesAfterDown.includes('exams_agreement_pairs')).toBe(isSqlite)
    expect(await storedPairs()).toHaveLength(1)
  })
})

import type { Sequelize } from 'sequelize'
import { QueryTypes } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { createMigrator } from '../../../server/db/migrator.ts'
import { ExamModel, initModels } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, openBlankDatabase } from '../helpers.ts'
import { DAY, MINUTE, examValues } from './factories.ts'

const MIGRATION = '2026.12.10T09.30.00.agreement-pair-bounds'
const TABLE_MIGRATION = '2026.12.08T09.00.00.agreement-pairs-table'
let sequelize: Sequelize

beforeEach(async () => {
  sequelize = await openBlankDatabase()
  initModels(sequelize)
})

afterEach(async () => {
  await sequelize.close()
})

/**
 * One patient: a resident's seen exam, an attending's "not filled" 30 minutes later and a second resident's seen exam
 * at 100 minutes. With bounds the nearest two pair (resident, attending); without, the two seen exams (100 minutes).
 * Stored straight into the exams table, so no pair is derived until a migration does it.
 */
async function storeExams() {
  const team = await makeTeam()
  const [resident, attending, resident2] = [
    await makeCaller({ roles: ['resident'], teamIds: [team.id] }),
    await makeCaller({ roles: ['attending'], teamIds: [team.id] }),
    await makeCaller({ roles: ['resident'], teamIds: [team.id] }),
  ]
  const at = Date.now() - 10 * DAY
  const exam = (examinerId: string, minutes: number, findings = {}) =>
    ExamModel.create(examValues({ examinerId, teamId: team.id, at: at + minutes * MINUTE, findings: { inclinationDeg: 0, ...findings } }))
  const first = await exam(resident.user.id, 0)
  const bound = await exam(attending.user.id, 30, { columnTop: 'not-filled', heightCm: null })
  const last = await exam(resident2.user.id, 100)
  return { withBounds: [first.id, bound.id], seenOnly: [first.id, last.id] }
}

const storedPairs = () =>
  sequelize.query<{ earlierExamId: string; laterExamId: string; laterHeightCm: number | null }>(
    'SELECT "earlierExamId", "laterExamId", "laterHeightCm" FROM "agreement_pairs"',
    { type: QueryTypes.SELECT },
  )
const idsOf = (rows: { earlierExamId: string; laterExamId: string }[]) => rows.map((r) => [r.earlierExamId, r.laterExamId])

describe(`migration ${MIGRATION}`, () => {
  it('on up, pairs the stored bounds (a not-filled exam without a height); down pairs the seen exams again among themselves', async () => {
    const migrator = createMigrator(sequelize)
    await migrator.up()
    const { withBounds, seenOnly } = await storeExams()
    await migrator.down({ to: TABLE_MIGRATION })

    await migrator.up({ to: TABLE_MIGRATION })
    const beforeBounds = await storedPairs()
    await migrator.up()
    const afterUp = await storedPairs()
    await migrator.down({ to: MIGRATION })
    const afterDown = await storedPairs()

    expect(idsOf(beforeBounds)).toEqual([seenOnly])
    expect(idsOf(afterUp)).toEqual([withBounds])
    expect(afterUp[0]!.laterHeightCm).toBeNull()
    expect(idsOf(afterDown)).toEqual([seenOnly])
  })
})

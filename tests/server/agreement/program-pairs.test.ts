import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { QueryTypes } from 'sequelize'
import { afterEach, describe, expect, it } from 'vitest'
import { QUERIES } from '../../../server/agreement/pair-source.ts'
import { programPairs } from '../../../server/agreement/program-pairs.ts'
import { createMigrator } from '../../../server/db/migrator.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { ExamModel, initModels, UserModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, storeExam } from './factories.ts'

const T0 = Date.now() - 30 * DAY
const cleanups: (() => Promise<void>)[] = []

afterEach(async () => {
  for (const cleanup of cleanups.splice(0)) await cleanup()
})

/** A migrated SQLite file, so that transactions run on connections of their own as in production. */
async function fileDatabase() {
  const dir = mkdtempSync(path.join(tmpdir(), 'plumbline-agreement-'))
  const sequelize = openDatabase(path.join(dir, 'test.sqlite'))
  initModels(sequelize)
  await createMigrator(sequelize).up()
  cleanups.push(async () => {
    await sequelize.close()
    rmSync(dir, { recursive: true, force: true })
  })
  return sequelize
}

async function residentAndAttending() {
  const team = await makeTeam()
  const [resident, attending] = [await makeCaller({ teamIds: [team.id] }), await makeCaller({ roles: ['attending'], teamIds: [team.id] })]
  const examBy = (who: typeof resident, patientCode: string, minutes: number, heightCm = 4) =>
    storeExam({ examinerId: who.user.id, teamId: team.id, patientCode, at: T0 + minutes * MINUTE, heightCm })
  return { resident, attending, examBy }
}

describe('programPairs', () => {
  it('answers the same pairs while nothing changed', async () => {
    await makeTestApp()
    const { resident, attending, examBy } = await residentAndAttending()
    await examBy(resident, 'SM-0142', 0)
    await examBy(attending, 'SM-0142', 30)

    const first = await programPairs()
    const again = await programPairs()

    expect(first.pairs).toHaveLength(1)
    expect(again.pairs).toBe(first.pairs)
  })

  it('after a write, pairs again only the patients whose exams changed', async () => {
    const { sequelize } = await makeTestApp()
    const { resident, attending, examBy } = await residentAndAttending()
    await examBy(resident, 'SM-0142', 0)
    await examBy(attending, 'SM-0142', 30)
    const changed = await examBy(resident, 'SM-0157', 1000, 2)
    await examBy(attending, 'SM-0157', 1030)
    await sequelize.query('UPDATE exams SET updatedAt = :at', { replacements: { at: new Date(T0) } })
    const before = await programPairs()

    await changed.update({ verticalHeightCm: 3 })
    await examBy(resident, 'SM-0171', 2000)
    await examBy(attending, 'SM-0171', 2030)
    const after = await programPairs()

    const pairOf = (pairs: typeof after.pairs, code: string) => pairs.find((p) => p.first.patientCode === code)!
    expect(after.pairs).toHaveLength(3)
    expect(pairOf(after.pairs, 'SM-0142')).toBe(pairOf(before.pairs, 'SM-0142'))
    expect(pairOf(after.pairs, 'SM-0157').first.heightCm).toBe(3)
  })

  it('turns the difference round when an examiner becomes an attending', async () => {
    await makeTestApp()
    const { resident, attending, examBy } = await residentAndAttending()
    await examBy(attending, 'SM-0142', 0)
    await examBy(resident, 'SM-0142', 30)
    const before = await programPairs()

    await (await UserModel.findByPk(resident.user.id))!.update({ roles: ['attending'] })
    const after = await programPairs()

    expect(before.pairs[0]).toMatchObject({ order: 'resident-minus-attending', first: { examinerId: resident.user.id } })
    expect(after.pairs[0]).toMatchObject({ order: 'earlier-minus-later', first: { examinerId: attending.user.id } })
  })

  it('drops the pair of a deleted exam', async () => {
    await makeTestApp()
    const { resident, attending, examBy } = await residentAndAttending()
    const deleted = await examBy(resident, 'SM-0142', 0)
    await examBy(attending, 'SM-0142', 30)
    await programPairs()

    await ExamModel.destroy({ where: { id: deleted.id } })
    const after = await programPairs()

    expect(after.pairs).toEqual([])
  })

  it('rebuilds after a write that another connection committed', async () => {
    const sequelize = await fileDatabase()
    const { resident, attending, examBy } = await residentAndAttending()
    await examBy(resident, 'SM-0142', 0, 3)
    await examBy(attending, 'SM-0142', 30, 5)
    const before = await programPairs()

    const where = { examinerId: resident.user.id }
    await sequelize.transaction((transaction) => ExamModel.update({ verticalHeightCm: 4 }, { where, transaction }))
    const after = await programPairs()

    expect(before.pairs[0]!.first.heightCm).toBe(3)
    expect(after.pairs[0]!.first.heightCm).toBe(4)
  })

  it('reads heights exactly as stored, whatever their decimals', async () => {
    await fileDatabase()
    const { resident, attending, examBy } = await residentAndAttending()
    const stored = await examBy(resident, 'SM-0142', 0, -2.5)
    const alongNeck = { heightMethod: 'along-neck', heightCm: null, alongNeckCm: 7.3, inclinationDeg: 37 } as const
    await storeExam({ examinerId: attending.user.id, teamId: stored.teamId, patientCode: 'SM-0142', at: T0 + 20 * MINUTE, findings: alongNeck })
    const heights = (await ExamModel.findAll({ order: [['examinedAt', 'ASC']] })).map((e) => e.verticalHeightCm)

    const { pairs } = await programPairs()

    expect([pairs[0]!.first.heightCm, pairs[0]!.second.heightCm]).toEqual(heights)
    expect(String(heights[1]).length).toBeGreaterThan(8)
  })

  it('reads the agreement index rather than the wide exam rows', async () => {
    const sequelize = await fileDatabase()
    await makeTeam()

    const plan = await sequelize.query<{ detail: string }>(`EXPLAIN QUERY PLAN ${QUERIES.fast()}`, { type: QueryTypes.SELECT })

    expect(plan.map((step) => step.detail).join('\n')).toMatch(/SCAN e USING INDEX exams_agreement_pairs/)
  })
})

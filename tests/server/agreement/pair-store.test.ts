import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterEach, describe, expect, it } from 'vitest'
import { derivePairs } from '../../../server/agreement/pair-derivation.ts'
import { programPairs } from '../../../server/agreement/pair-store.ts'
import { createMigrator } from '../../../server/db/migrator.ts'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { ExamModel, initModels } from '../../../server/models/index.ts'
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

/** Changes an exam's height outside the exams service, deriving its patient's pairs in the same transaction. */
async function changeHeight(exam: ExamModel, verticalHeightCm: number) {
  const sequelize = ExamModel.sequelize!
  await sequelize.transaction(async (transaction) => {
    await ExamModel.update({ verticalHeightCm }, { where: { id: exam.id }, transaction })
    await derivePairs([exam.patientCode], { sequelize, transaction })
  })
}

const pairOf = (pairs: Awaited<ReturnType<typeof programPairs>>['pairs'], code: string) => pairs.find((p) => p.first.patientCode === code)!

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

  it('after writes, reads again only the patients whose pairs were derived again', async () => {
    await makeTestApp()
    const { resident, attending, examBy } = await residentAndAttending()
    await examBy(resident, 'SM-0142', 0)
    await examBy(attending, 'SM-0142', 30)
    const changed = await examBy(resident, 'SM-0157', 1000, 2)
    await examBy(attending, 'SM-0157', 1030)
    const before = await programPairs()

    await changeHeight(changed, 3)
    await examBy(resident, 'SM-0171', 2000)
    await examBy(attending, 'SM-0171', 2030)
    const after = await programPairs()

    expect(after.pairs).toHaveLength(3)
    // The same reading objects: that patient's pairs were not read again.
    expect(pairOf(after.pairs, 'SM-0142').first).toBe(pairOf(before.pairs, 'SM-0142').first)
    expect(pairOf(after.pairs, 'SM-0157').first.heightCm).toBe(3)
  })

  it('leaves the pairs as they were when the deriving transaction rolls back', async () => {
    const { sequelize } = await makeTestApp()
    const { resident, attending, examBy } = await residentAndAttending()
    const exam = await examBy(resident, 'SM-0142', 0, 2)
    await examBy(attending, 'SM-0142', 30)
    await programPairs()

    const failed = sequelize.transaction(async (transaction) => {
      await ExamModel.update({ verticalHeightCm: 3 }, { where: { id: exam.id }, transaction })
      await derivePairs([exam.patientCode], { sequelize, transaction })
      throw new Error('rolled back')
    })

    await expect(failed).rejects.toThrow('rolled back')
    expect((await programPairs()).pairs[0]!.first.heightCm).toBe(2)
  })

  it('sees a write that another connection committed', async () => {
    await fileDatabase()
    const { resident, attending, examBy } = await residentAndAttending()
    const exam = await examBy(resident, 'SM-0142', 0, 3)
    await examBy(attending, 'SM-0142', 30, 5)
    const before = await programPairs()

    await changeHeight(exam, 4)
    const after = await programPairs()

    expect(before.pairs[0]!.first.heightCm).toBe(3)
    expect(after.pairs[0]!.first.heightCm).toBe(4)
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import type { Exam } from '#shared/schemas/exam'
import { derivePairs } from '../../../server/agreement/pair-derivation.ts'
import { ExamModel, UserModel } from '../../../server/models/index.ts'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, pairsAs, storeExam } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let sequelize: Awaited<ReturnType<typeof makeTestApp>>['sequelize']

beforeEach(async () => {
  ;({ app, sequelize } = await makeTestApp())
})

const T0 = Date.now() - 30 * DAY

async function ward() {
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  return { team, resident, attending }
}

const post = (path: string, auth: string, body: object) => request(app).post(`/api/exams/${path}`).set('Authorization', auth).send(body)
const patch = (exam: Exam, auth: string, body: object) => request(app).patch(`/api/exams/${exam.id}`).set('Authorization', auth).send(body)

describe('agreement pairs follow every write to the exams (same transaction)', () => {
  it('a return keeps the pair, an amend to a draft takes it away, and the resubmitted reading pairs with its new height', async () => {
    const { team, resident, attending } = await ward()
    const own = await recordSubmittedExam(app, resident.auth, { teamId: team.id, heightCm: 3 })
    await recordSubmittedExam(app, attending.auth, { teamId: team.id, heightCm: 4 })
    const submitted = (await pairsAs(app, attending.auth)).list!.total

    const returned = await post(`${own.id}/return`, attending.auth, { comment: 'Check the ruler', baseVersion: own.version })
    const afterReturn = (await pairsAs(app, attending.auth)).list!.total
    const amended = await post(`${own.id}/amend`, resident.auth, { baseVersion: returned.body.version })
    const afterAmend = (await pairsAs(app, attending.auth)).list!.total
    const changed = await patch(own, resident.auth, { heightCm: 5, baseVersion: amended.body.version })
    await post(`${own.id}/submit`, resident.auth, { baseVersion: changed.body.version })
    const resubmitted = (await pairsAs(app, attending.auth)).list!

    expect([submitted, afterReturn, afterAmend]).toEqual([1, 1, 0])
    expect(resubmitted.total).toBe(1)
    expect(resubmitted.pairs[0]!.first).toMatchObject({ examId: own.id, heightCm: 5 })
  })

  it('a returned exam moved to another patient code leaves its old pair and pairs under the new code', async () => {
    const { team, resident, attending } = await ward()
    const own = await recordSubmittedExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0142' })
    await recordSubmittedExam(app, attending.auth, { teamId: team.id, patientCode: 'SM-0142' })
    await recordSubmittedExam(app, attending.auth, { teamId: team.id, patientCode: 'SM-0157' })
    const returned = await post(`${own.id}/return`, attending.auth, { comment: 'Wrong patient code', baseVersion: own.version })

    await patch(own, resident.auth, { patientCode: 'SM-0157', baseVersion: returned.body.version })
    const { list } = await pairsAs(app, attending.auth)

    expect(list!.total).toBe(1)
    expect(list!.pairs[0]).toMatchObject({ patientCode: 'SM-0157', first: { examId: own.id } })
  })

  it('a write that fails leaves the pairs as they were', async () => {
    const { team, resident, attending } = await ward()
    const own = await storeExam({ examinerId: resident.user.id, teamId: team.id, at: T0 })
    await storeExam({ examinerId: attending.user.id, teamId: team.id, at: T0 + 30 * MINUTE })

    const write = sequelize.transaction(async (transaction) => {
      await ExamModel.update({ status: 'draft' }, { where: { id: own.id }, transaction })
      await derivePairs([own.patientCode], { sequelize, transaction })
      throw new Error('the write failed after deriving')
    })

    await expect(write).rejects.toThrow('the write failed after deriving')
    expect((await pairsAs(app, attending.auth)).list!.total).toBe(1)
  })

  it('turns the difference round when an examiner becomes an attending, with no exam written', async () => {
    const { team, resident, attending } = await ward()
    const educator = await makeCaller({ roles: ['educator'] })
    await storeExam({ examinerId: attending.user.id, teamId: team.id, at: T0, heightCm: 5 })
    await storeExam({ examinerId: resident.user.id, teamId: team.id, at: T0 + 30 * MINUTE, heightCm: 3 })
    const before = (await pairsAs(app, educator.auth)).list!.pairs[0]

    await (await UserModel.findByPk(resident.user.id))!.update({ roles: ['attending'] })
    const after = (await pairsAs(app, educator.auth)).list!.pairs[0]

    expect(before).toMatchObject({ order: 'resident-minus-attending', differenceCm: -2, first: { examinerId: resident.user.id } })
    expect(after).toMatchObject({ order: 'earlier-minus-later', differenceCm: 2, first: { examinerId: attending.user.id } })
  })

  it('keeps heights exactly as stored, whatever their decimals', async () => {
    const { team, resident, attending } = await ward()
    await storeExam({ examinerId: resident.user.id, teamId: team.id, at: T0, heightCm: -2.5 })
    const alongNeck = { heightMethod: 'along-neck', heightCm: null, alongNeckCm: 7.3, inclinationDeg: 37 } as const
    await storeExam({ examinerId: attending.user.id, teamId: team.id, at: T0 + 20 * MINUTE, findings: alongNeck })
    const stored = (await ExamModel.findAll({ order: [['examinedAt', 'ASC']] })).map((e) => e.verticalHeightCm)

    const pair = (await pairsAs(app, attending.auth)).list!.pairs[0]!

    expect([pair.first.heightCm, pair.second.heightCm]).toEqual(stored)
    expect(String(stored[1]).length).toBeGreaterThan(8)
  })
})

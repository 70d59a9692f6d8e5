import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { SignoffQueueSchema } from '#shared/schemas/signoff-queue'
import { MembershipModel } from '../../../server/models/index.ts'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

/** The queue as the caller reads it, compressed as a browser asks: the patient codes in order. */
async function queueCodes(auth: string, query: Record<string, string> = {}): Promise<string[]> {
  const res = await request(app).get('/api/signoff-queue').set('Authorization', auth).set('Accept-Encoding', 'br, gzip').query(query)
  if (res.status !== 200) throw new Error(`queue: ${res.status} ${JSON.stringify(res.body)}`)
  return SignoffQueueSchema.parse(res.body).items.map((i) => i.exam.patientCode)
}

describe('GET /api/signoff-queue, answered from the answer cache', () => {
  it('when two attendings of different teams ask the same query in turn, each gets only their own teams’ exams', async () => {
    const north = await makeWard('Ward 7 North')
    const south = await makeWard('Ward 2 South')
    await recordSubmittedExam(app, north.resident.auth, { teamId: north.team.id, patientCode: 'SM-0101' })
    await recordSubmittedExam(app, south.resident.auth, { teamId: south.team.id, patientCode: 'SM-0202' })

    const [first, second, firstAgain] = [
      await queueCodes(north.attending.auth),
      await queueCodes(south.attending.auth),
      await queueCodes(north.attending.auth),
    ]

    expect(first).toEqual(['SM-0101'])
    expect(second).toEqual(['SM-0202'])
    expect(firstAgain).toEqual(['SM-0101'])
  })

  it('when an attending leaves a team, the next read no longer lists that team’s exams', async () => {
    const north = await makeWard('Ward 7 North')
    await recordSubmittedExam(app, north.resident.auth, { teamId: north.team.id, patientCode: 'SM-0101' })
    const before = await queueCodes(north.attending.auth)

    await MembershipModel.destroy({ where: { userId: north.attending.user.id, teamId: north.team.id } })

    expect(before).toEqual(['SM-0101'])
    expect(await queueCodes(north.attending.auth)).toEqual([])
  })

  it('when the search, the order or the resident changes, answers each query as asked', async () => {
    const ward = await makeWard()
    const other = await makeCaller({ teamIds: [ward.team.id], displayName: 'Dr Ana Ferreira' })
    await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'SM-0101' })
    await recordSubmittedExam(app, other.auth, { teamId: ward.team.id, patientCode: 'SM-0202' })

    const all = await queueCodes(ward.attending.auth)
    const newest = await queueCodes(ward.attending.auth, { order: 'newest' })
    const searched = await queueCodes(ward.attending.auth, { q: '0202' })
    const byResident = await queueCodes(ward.attending.auth, { residentId: ward.resident.user.id })

    expect(all).toEqual(['SM-0101', 'SM-0202'])
    expect(newest).toEqual(['SM-0202', 'SM-0101'])
    expect(searched).toEqual(['SM-0202'])
    expect(byResident).toEqual(['SM-0101'])
  })

  it('when a resident submits or an attending countersigns, the next read shows it at once', async () => {
    const ward = await makeWard()
    const waiting = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'SM-0101' })
    const before = await queueCodes(ward.attending.auth)

    await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'SM-0202' })
    const afterSubmit = await queueCodes(ward.attending.auth)
    expect((await act(app, ward.attending.auth, waiting, 'countersign', SIGN)).status).toBe(200)
    const afterSign = await queueCodes(ward.attending.auth)

    expect(before).toEqual(['SM-0101'])
    expect(afterSubmit).toEqual(['SM-0101', 'SM-0202'])
    expect(afterSign).toEqual(['SM-0202'])
  })

  it('when the cursor is not one the server made, responds 400 with the field and keeps answering the queue', async () => {
    const ward = await makeWard()
    await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'SM-0101' })

    const res = await request(app).get('/api/signoff-queue').set('Authorization', ward.attending.auth).query({ cursor: 'forged' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('cursor')
    expect(await queueCodes(ward.attending.auth)).toEqual(['SM-0101'])
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { RoundListSchema } from '#shared/schemas/round'
import { AuditEventModel, RoundModel } from '../../../server/models/index.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { calibrationWard, codes, createRoundAs, detailAs, openRound, pseudonym } from './round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

describe('creating a calibration round (POST /api/rounds)', () => {
  it('an educator names patient codes and examiners; the round starts open with an empty progress grid', async () => {
    const { educator, examiners } = await calibrationWard(3)

    const round = await openRound(app, educator, ['SM-0301', 'SM-0302'], examiners, 'November calibration')

    expect(round.status).toBe('open')
    expect(round.name).toBe('November calibration')
    expect(round.createdBy.displayName).toBe('Dr Hana Okafor')
    // The educator typed the codes, but reads them back as pseudonyms, as for any exam.
    expect(round.patientCodes).toEqual([pseudonym('SM-0301'), pseudonym('SM-0302')])
    expect(round.codesMasked).toBe(true)
    expect(round.examiners.map((e) => e.id)).toEqual(examiners.map((e) => e.user.id))
    expect(round.expected).toBe(6)
    expect(round.recorded).toBe(0)
    expect(round.entries.every((e) => e.state === 'missing')).toBe(true)
    expect(round.canClose).toBe(true)
  })

  it('is audited as round-create by the educator, with the codes and examiners', async () => {
    const { educator, examiners } = await calibrationWard(2)

    const round = await openRound(app, educator, ['SM-0301'], examiners)

    const events = await AuditEventModel.findAll({ where: { entityType: 'round', entityId: round.id } })
    expect(events.map((e) => [e.action, e.actorId])).toEqual([['round-create', educator.user.id]])
    const changes = JSON.parse(events[0]!.changes!)
    expect(changes.patientCodes.to).toEqual(['SM-0301'])
    expect(changes.examinerIds.to).toEqual(examiners.map((e) => e.user.id))
  })

  it('needs at least two examiners and one patient code, each field answered on its own', async () => {
    const { educator, examiners } = await calibrationWard(1)

    const res = await createRoundAs(app, educator.auth, { name: ' ', patientCodes: [], examinerIds: [examiners[0]!.user.id] })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['examinerIds', 'name', 'patientCodes'])
    expect(res.body.error.fields.examinerIds).toMatch(/at least two/)
    expect(await RoundModel.count()).toBe(0)
  })

  it('refuses a repeated patient code (in any case) and a repeated examiner, at their positions', async () => {
    const { educator, examiners } = await calibrationWard(2)
    const ids = examiners.map((e) => e.user.id)

    const res = await createRoundAs(app, educator.auth, { name: 'R', patientCodes: ['SM-0301', 'SM-0302', 'sm-0301'], examinerIds: [...ids, ids[0]] })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toMatchObject({ 'patientCodes.2': expect.stringMatching(/already/), 'examinerIds.2': expect.stringMatching(/already/) })
  })

  it('refuses a patient code that could be a name, as exams do', async () => {
    const { educator, examiners } = await calibrationWard(2)

    const res = await createRoundAs(app, educator.auth, { name: 'R', patientCodes: ['Jane Doe'], examinerIds: examiners.map((e) => e.user.id) })

    expect(res.status).toBe(400)
    expect(res.body.error.fields['patientCodes.0']).toMatch(/letters, digits/)
  })

  it('examiners must be existing residents or attendings: an unknown id and an educator are refused by position', async () => {
    const { educator, examiners } = await calibrationWard(1)
    const otherEducator = await makeCaller({ roles: ['educator'], displayName: 'Dr Other Educator' })

    const res = await createRoundAs(app, educator.auth, {
      name: 'R',
      patientCodes: ['SM-0301'],
      examinerIds: [examiners[0]!.user.id, 'no-such-account', otherEducator.user.id],
    })

    expect(res.status).toBe(400)
    expect(res.body.error.fields['examinerIds.0']).toBeUndefined()
    expect(res.body.error.fields['examinerIds.1']).toMatch(/No such/)
    expect(res.body.error.fields['examinerIds.2']).toMatch(/does not record exams/)
    expect(await RoundModel.count()).toBe(0)
  })

  it('only educators create rounds: residents, attendings and admins get 403', async () => {
    const { examiners } = await calibrationWard(2)
    const body = { name: 'R', patientCodes: ['SM-0301'], examinerIds: examiners.map((e) => e.user.id) }

    for (const roles of [['resident'], ['attending'], ['admin']] as const) {
      const caller = await makeCaller({ roles: [...roles] })
      const res = await createRoundAs(app, caller.auth, body)
      expect(res.status, roles[0]).toBe(403)
    }
    expect(await RoundModel.count()).toBe(0)
  })
})

describe('who sees which rounds (GET /api/rounds, GET /api/rounds/:id)', () => {
  it('an educator lists the rounds they created; an examiner the rounds they are in; an outsider none', async () => {
    const { educator, examiners, outsider } = await calibrationWard(2)
    const otherEducator = await makeCaller({ roles: ['educator'] })
    const mine = await openRound(app, educator, codes(2), examiners, 'Mine')
    const theirs = await openRound(app, otherEducator, codes(1), [examiners[0]!, outsider], 'Theirs')

    const list = async (auth: string) =>
      RoundListSchema.parse((await request(app).get('/api/rounds').set('Authorization', auth)).body).rounds.map((r) => r.name)

    expect(await list(educator.auth)).toEqual(['Mine'])
    expect((await list(examiners[0]!.auth)).sort()).toEqual(['Mine', 'Theirs'])
    expect(await list(examiners[1]!.auth)).toEqual(['Mine'])
    expect(await list(outsider.auth)).toEqual(['Theirs'])
    expect((await detailAs(app, examiners[1]!.auth, theirs.id)).res.status).toBe(404)
    expect((await detailAs(app, otherEducator.auth, mine.id)).res.status).toBe(404)
    expect((await detailAs(app, examiners[0]!.auth, mine.id)).round?.isExaminer).toBe(true)
  })
})

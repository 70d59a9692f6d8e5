import { beforeEach, describe, expect, it } from 'vitest'
import { AuditEventModel, RoundModel } from '../../../server/models/index.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { calibrationWard, closeRoundAs, codes, detailAs, openRound } from './round-setup.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

describe('closing a round (POST /api/rounds/:id/close)', () => {
  it('the educator who created it closes it; the close is stamped and audited as round-close', async () => {
    const { educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, codes(2), examiners)

    const res = await closeRoundAs(app, educator.auth, round.id)

    expect(res.status).toBe(200)
    expect(res.body.status).toBe('closed')
    expect(res.body.canClose).toBe(false)
    expect(typeof res.body.closedAt).toBe('string')
    const events = await AuditEventModel.findAll({ where: { entityType: 'round', entityId: round.id }, order: [['id', 'ASC']] })
    expect(events.map((e) => [e.action, e.actorId])).toEqual([
      ['round-create', educator.user.id],
      ['round-close', educator.user.id],
    ])
    expect(JSON.parse(events[1]!.changes!).status).toEqual({ from: 'open', to: 'closed' })
  })

  it('an examiner of the round gets 403, another educator 404, and the round stays open with no close event', async () => {
    const { educator, examiners } = await calibrationWard(2)
    const otherEducator = await makeCaller({ roles: ['educator'] })
    const round = await openRound(app, educator, codes(2), examiners)

    const byExaminer = await closeRoundAs(app, examiners[0]!.auth, round.id)
    const byOther = await closeRoundAs(app, otherEducator.auth, round.id)

    expect(byExaminer.status).toBe(403)
    expect(byOther.status).toBe(404)
    expect((await RoundModel.findByPk(round.id))!.status).toBe('open')
    expect(await AuditEventModel.count({ where: { action: 'round-close' } })).toBe(0)
    expect((await detailAs(app, examiners[0]!.auth, round.id)).round!.canClose).toBe(false)
  })

  it('closing twice answers 409 and records one close', async () => {
    const { educator, examiners } = await calibrationWard(2)
    const round = await openRound(app, educator, codes(2), examiners)

    await closeRoundAs(app, educator.auth, round.id)
    const again = await closeRoundAs(app, educator.auth, round.id)

    expect(again.status).toBe(409)
    expect(await AuditEventModel.count({ where: { action: 'round-close' } })).toBe(1)
  })
})

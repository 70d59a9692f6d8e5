import request from 'supertest'
import type { Sequelize } from 'sequelize'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamHistorySchema } from '#shared/schemas/audit'
import type { Exam } from '#shared/schemas/exam'
import { AuditEventModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { act, eventsOf, makeWard, SIGN } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let sequelize: Sequelize

beforeEach(async () => {
  ;({ app, sequelize } = await makeTestApp())
})

async function submittedOnWard(patientCode = 'SM-0157') {
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode })
  return { ...ward, exam }
}

async function historyAs(auth: string, exam: Pick<Exam, 'id'>) {
  const res = await request(app).get(`/api/exams/${exam.id}/history`).set('Authorization', auth)
  return { res, events: res.status === 200 ? ExamHistorySchema.parse(res.body).events : [] }
}

describe('audit events of the supervision workflow', () => {
  it('submit leaves one exam-submit event by the author with the status and version before and after', async () => {
    const { resident, exam } = await submittedOnWard()

    const events = await eventsOf(exam.id, 'exam-submit')

    expect(events).toEqual([{ actorId: resident.user.id, changes: expect.objectContaining({ status: { from: 'draft', to: 'submitted' } }) }])
  })

  it('countersign leaves one exam-countersign event by the signer with the status change and the signature bound', async () => {
    const { attending, exam } = await submittedOnWard()

    const res = await act(app, attending.auth, exam, 'countersign', SIGN)

    const [signature] = res.body.signatures
    expect(await eventsOf(exam.id, 'exam-countersign')).toEqual([
      {
        actorId: attending.user.id,
        changes: {
          status: { from: 'submitted', to: 'countersigned' },
          signature: { from: null, to: { id: signature.id, meaning: 'reviewed-agree', examVersion: exam.version, hash: signature.hash } },
        },
      },
    ])
  })

  it('a wrong signing password leaves one exam-countersign-failed event by the would-be signer and nothing else', async () => {
    const { attending, exam } = await submittedOnWard()
    const before = await AuditEventModel.count()

    await act(app, attending.auth, exam, 'countersign', { ...SIGN, password: 'wrong' })

    expect(await AuditEventModel.count()).toBe(before + 1)
    expect(await eventsOf(exam.id, 'exam-countersign-failed')).toEqual([{ actorId: attending.user.id, changes: { reason: 'wrong-password' } }])
  })

  it('return leaves one exam-return event by the attending with the comment, status and version', async () => {
    const { attending, exam } = await submittedOnWard()

    await act(app, attending.auth, exam, 'return', { comment: 'Recheck sitting up' })

    expect(await eventsOf(exam.id, 'exam-return')).toEqual([
      {
        actorId: attending.user.id,
        changes: {
          status: { from: 'submitted', to: 'returned' },
          version: { from: exam.version, to: exam.version + 1 },
          returnComment: { from: null, to: 'Recheck sitting up' },
        },
      },
    ])
  })

  it('amending a countersigned exam leaves one exam-amend event by the author naming the superseded signature', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    const signed = await act(app, attending.auth, exam, 'countersign', SIGN)

    await act(app, resident.auth, exam, 'amend')

    expect(await eventsOf(exam.id, 'exam-amend')).toEqual([
      {
        actorId: resident.user.id,
        changes: {
          status: { from: 'countersigned', to: 'draft' },
          version: { from: exam.version, to: exam.version + 1 },
          signatureSuperseded: { from: null, to: signed.body.signatures[0].id },
        },
      },
    ])
  })

  it.each([
    ['UPDATE', `UPDATE audit_events SET "actorId" = NULL WHERE action = 'exam-countersign'`],
    ['DELETE', `DELETE FROM audit_events WHERE action = 'exam-countersign'`],
  ])('the database refuses to %s a countersign event', async (_verb, sql) => {
    const { attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'countersign', SIGN)

    const refused = await sequelize.query(sql).then(
      () => 'no error',
      (e: { original?: Error }) => e.original?.message,
    )

    expect(refused).toMatch(/append-only/)

    expect(await eventsOf(exam.id, 'exam-countersign')).toEqual([expect.objectContaining({ actorId: attending.user.id })])
  })
})

describe('GET /api/exams/:id/history', () => {
  it('answers the exam’s events oldest first, with the actor’s name', async () => {
    const { resident, attending, exam } = await submittedOnWard()
    await act(app, attending.auth, exam, 'return', { comment: 'Recheck sitting up' })

    const { res, events } = await historyAs(resident.auth, exam)

    expect(res.status).toBe(200)
    expect(events.map((e) => [e.action, e.actorName])).toEqual([
      ['exam-create', 'Dr Sam Whitcombe'],
      ['exam-submit', 'Dr Sam Whitcombe'],
      ['exam-return', 'Dr Tomas Lindqvist'],
    ])
  })

  it('shows an educator the patient code masked in every before/after, free text included', async () => {
    const { attending, exam } = await submittedOnWard('SM-0157')
    await act(app, attending.auth, exam, 'return', { comment: 'Is sm-0157 the right patient?' })
    const educator = await makeCaller({ roles: ['educator'] })

    const { res, events } = await historyAs(educator.auth, exam)

    expect(res.status).toBe(200)
    expect(JSON.stringify(res.body)).not.toMatch(/SM-0157/i)
    const created = events.find((e) => e.action === 'exam-create')!
    expect(created.changes!.patientCode).toEqual({ from: null, to: expect.stringMatching(/^P-[0-9a-f]{8}$/) })
  })

  it('shows the attending of the ward the real patient code', async () => {
    const { attending, exam } = await submittedOnWard('SM-0157')

    const { events } = await historyAs(attending.auth, exam)

    expect(events[0]!.changes!.patientCode).toEqual({ from: null, to: 'SM-0157' })
  })

  it('answers 404 to another resident and to an attending who cannot see the draft', async () => {
    const { team, resident, attending } = await makeWard()
    const draft = await recordExam(app, resident.auth, { teamId: team.id })
    const other = await makeCaller({ teamIds: [team.id] })

    const statuses = [(await historyAs(other.auth, draft)).res.status, (await historyAs(attending.auth, draft)).res.status]

    expect(statuses).toEqual([404, 404])
  })
})

import request from 'supertest'
import { Op } from 'sequelize'
import type { Exam } from '#shared/schemas/exam'
import { AuditEventModel, ExamModel, SignatureModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, PASSWORD } from '../helpers.ts'

type App = Parameters<typeof request>[0]

export const SIGN = { password: PASSWORD, meaning: 'reviewed-agree' } as const

/** Countersigning after re-examining: the attending's own reading of the same patient is required. */
export const RE_EXAMINED = { ...SIGN, meaning: 'reviewed-re-examined', attendingReading: { heightCm: 6, inclinationDeg: 45 } } as const

/** A ward with a resident and an attending who can sign (the attending has a real password). */
export async function makeWard(name = 'Ward 7 North') {
  const team = await makeTeam(name)
  const resident = await makeCaller({ teamIds: [team.id], displayName: 'Dr Sam Whitcombe' })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id], displayName: 'Dr Tomas Lindqvist', withPassword: true })
  return { team, resident, attending }
}

/** `POST /api/exams/:id/<action>` as the caller. */
export function act(app: App, auth: string, exam: Pick<Exam, 'id'>, action: string, body: object = {}) {
  return request(app).post(`/api/exams/${exam.id}/${action}`).set('Authorization', auth).send(body)
}

/** Everything an action could change about an exam, to show that a refused one changed nothing. */
export async function recordOf(examId: string) {
  const row = (await ExamModel.findByPk(examId))!
  return {
    status: row.status,
    version: row.version,
    heightCm: row.heightCm,
    returnComment: row.returnComment,
    updatedAt: row.updatedAt.toISOString(),
    signatures: await SignatureModel.count({ where: { examId } }),
    superseded: await SignatureModel.count({ where: { examId, supersededAt: { [Op.ne]: null } } }),
    events: await AuditEventModel.count({ where: { entityId: examId } }),
  }
}

export async function eventsOf(examId: string, action: string) {
  const rows = await AuditEventModel.findAll({ where: { entityId: examId, action } })
  return rows.map((r) => ({ actorId: r.actorId, changes: r.changes ? (JSON.parse(r.changes) as Record<string, unknown>) : null }))
}

import type { Server } from 'node:http'
import request from 'supertest'
import { makeExamInput, recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp, makeUser, PASSWORD } from '../helpers.ts'
import { WORKED_EXAMPLE_FINDINGS } from '../../../tests/shared/worked-example.ts'

export const ROLES = ['anonymous', 'bad-token', 'resident', 'attending', 'educator', 'admin'] as const
export type FuzzRole = (typeof ROLES)[number]

/** The app on a real port, with one caller per role, real records to aim at and a valid body per JSON route. */
export async function fuzzApp() {
  const { app } = await makeTestApp({ mailbox: { messages: () => [] } })
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s))
  })
  const team = await makeTeam()
  const resident = await makeUser({ roles: ['resident'], teamIds: [team.id] })
  const callers = {
    resident: await makeCaller({ roles: ['resident'], teamIds: [team.id] }),
    attending: await makeCaller({ roles: ['attending'], teamIds: [team.id] }),
    educator: await makeCaller({ roles: ['educator'] }),
    admin: await makeCaller({ roles: ['admin'] }),
  }
  const spare = await makeUser({ withPassword: false })
  const submitted = await recordSubmittedExam(app, callers.resident.auth, { teamId: team.id, notes: 'See also SM-0999' })
  const draft = await recordExam(app, callers.resident.auth, { teamId: team.id })
  const examinerIds = [callers.resident.user.id, callers.attending.user.id]
  const round = await request(app)
    .post('/api/rounds')
    .set('Authorization', callers.educator.auth)
    .send({ name: 'Fuzz round', patientCodes: ['SM-0142'], examinerIds })
  const settings = await request(app).get('/api/settings').set('Authorization', callers.admin.auth)
  if (round.status !== 201 || settings.status !== 200) throw new Error(`fuzz fixture: round ${round.status}, settings ${settings.status}`)

  const authOf = (role: FuzzRole): string | undefined =>
    role === 'anonymous' ? undefined : role === 'bad-token' ? 'Bearer not.a.token' : callers[role].auth

  const templates: Record<string, Record<string, unknown>> = {
    'POST /api/auth/login': { email: resident.email, password: PASSWORD },
    'POST /api/auth/password-reset': { email: resident.email },
    'POST /api/auth/set-password': { token: 'a'.repeat(43), password: 'four unrelated words here' },
    'POST /api/sync/push': { changes: [{ exam: makeExamInput({ teamId: team.id }), baseVersion: null }] },
    'POST /api/rounds': { name: 'Round', patientCodes: ['SM-0142'], examinerIds },
    'PUT /api/admin/settings': { ...settings.body.values, baseVersion: settings.body.version },
    'POST /api/estimate': { ...WORKED_EXAMPLE_FINDINGS },
    'POST /api/exams': makeExamInput({ teamId: team.id }) as Record<string, unknown>,
    'PATCH /api/exams/:id': { baseVersion: draft.version, notes: 'Changed' },
    'POST /api/exams/:id/submit': { baseVersion: draft.version },
    'POST /api/exams/:id/countersign': { password: PASSWORD, meaning: 'reviewed-agree', baseVersion: submitted.version },
    'POST /api/exams/:id/return': { comment: 'Please re-measure', baseVersion: submitted.version },
    'POST /api/exams/:id/amend': { baseVersion: submitted.version },
    'POST /api/admin/accounts': { email: 'new.person@example.test', displayName: 'New Person', roles: ['resident'], teamIds: [team.id] },
    'PATCH /api/admin/accounts/:id': { displayName: 'Renamed' },
  }
  return {
    server,
    authOf,
    templates,
    /** Ids the path parameters aim at: records that exist, and a spare account admins may change. */
    realIds: [submitted.id, draft.id, round.body.id as string, spare.id, String(settings.body.version)],
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}

export type FuzzApp = Awaited<ReturnType<typeof fuzzApp>>

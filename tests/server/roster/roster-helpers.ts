import { readFileSync } from 'node:fs'
import { pino } from 'pino'
import request from 'supertest'
import type { Express } from 'express'
import { startFakeSmtp, type FakeSmtp } from '../../../server/mail/fake-smtp.ts'
import { createMailer, type Mailer } from '../../../server/mail/mailer.ts'
import { AuditEventModel, MembershipModel, TeamModel, UserModel } from '../../../server/models/index.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

export const fixture = (name: string) => readFileSync(new URL(`../../fixtures/roster/${name}`, import.meta.url))

export const SALTMARSH_TEAMS = ['Ward 7 North — Cardiology', 'Acute Medical Unit', 'Medical ICU'] as const

/** Posts a roster file the way a browser form does: multipart, one file field named `file`. */
export function upload(app: Express, auth: string, step: 'preview' | 'apply', content: Buffer | string, filename = 'roster.csv') {
  return request(app)
    .post(`/api/admin/roster/${step}`)
    .set('Authorization', auth)
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8'), { filename, contentType: 'text/csv' })
}

/** The app wired to a real SMTP conversation with the fake server, the demo hospital's teams and an admin. */
export async function hospitalWithMail(cleanups: (() => unknown)[]) {
  const fake: FakeSmtp = await startFakeSmtp()
  cleanups.push(() => fake.close())
  const mailer: Mailer = createMailer({ host: '127.0.0.1', port: fake.port, from: 't@x', log: pino({ level: 'silent' }), retryDelaysMs: [20], maxAttempts: 500 })
  cleanups.push(() => mailer.close())
  const { app } = await makeTestApp({ mailer, baseUrl: 'https://plumbline.saltmarsh.test' })
  const teams = Object.fromEntries(await Promise.all(SALTMARSH_TEAMS.map(async (n) => [n, await makeTeam(n)] as const)))
  const admin = await makeCaller({ roles: ['admin'], email: 'admin@saltmarsh.test', displayName: 'Rhian Admin' })
  return { app, fake, mailer, teams, admin }
}

/** Every account with its roles and team names, sorted by e-mail: the state an import may change. */
export async function accountsSnapshot() {
  const users = await UserModel.findAll({ order: [['email', 'ASC']] })
  const teams = new Map((await TeamModel.findAll()).map((t) => [t.id, t.name]))
  const memberships = await MembershipModel.findAll()
  return users.map((u) => ({
    email: u.email,
    displayName: u.displayName,
    roles: u.roles,
    active: u.active,
    hasPassword: u.passwordHash !== null,
    teams: memberships.filter((m) => m.userId === u.id).map((m) => teams.get(m.teamId)).sort(),
  }))
}

export async function auditActions() {
  return (await AuditEventModel.findAll({ order: [['id', 'ASC']] })).map((e) => ({
    action: e.action,
    entityId: e.entityId,
    changes: e.changes ? (JSON.parse(e.changes) as Record<string, unknown>) : null,
  }))
}

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { AuditChainReportSchema, AuditPageSchema } from '#shared/schemas/audit'
import { AuditEventModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function browse(auth: string, query: Record<string, string | number> = {}) {
  const res = await request(app).get('/api/audit').set('Authorization', auth).query(query)
  return { res, page: res.status === 200 ? AuditPageSchema.parse(res.body) : null }
}

/** Appends an event at a chosen time, as the trail itself would have. */
function eventAt(at: string, action = 'login', actorId: string | null = null) {
  return AuditEventModel.create({ at: new Date(at), actorId, action, entityType: 'user', entityId: actorId, changes: null })
}

describe('GET /api/audit', () => {
  it('lists events newest first, with who did what to which entity', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    await eventAt('2026-01-01T08:00:00Z', 'login')
    await eventAt('2026-03-01T08:00:00Z', 'logout')

    const { res, page } = await browse(admin.auth)

    expect(res.status).toBe(200)
    expect(page!.events.map((e) => e.action)).toEqual(['logout', 'login'])
    expect(page).toMatchObject({ total: 2, page: 1, pageSize: 50 })
  })

  it('filters by actor, action and entity id', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id], displayName: 'Dr Aiko Brennan' })
    const exam = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    await recordExam(app, resident.auth, { teamId: team.id })

    const byActor = await browse(admin.auth, { actorId: resident.user.id })
    const byAction = await browse(admin.auth, { action: 'exam-submit' })
    const byEntity = await browse(admin.auth, { entityId: exam.id })

    expect(byActor.page!.total).toBe(3)
    expect(byActor.page!.events.every((e) => e.actorName === 'Dr Aiko Brennan')).toBe(true)
    expect(byAction.page!.events.map((e) => e.entityId)).toEqual([exam.id])
    expect(byEntity.page!.events.map((e) => e.action)).toEqual(['exam-submit', 'exam-create'])
  })

  it('filters by a date range, both ends included', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    for (const at of ['2026-01-01T08:00:00Z', '2026-02-01T08:00:00Z', '2026-03-01T08:00:00Z']) await eventAt(at)

    const { page } = await browse(admin.auth, { from: '2026-02-01T08:00:00Z', to: '2026-03-01T08:00:00+00:00' })

    expect(page!.events.map((e) => e.at)).toEqual(['2026-03-01T08:00:00.000Z', '2026-02-01T08:00:00.000Z'])
  })

  it('pages through the trail', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    for (const month of ['01', '02', '03', '04', '05']) await eventAt(`2026-${month}-01T08:00:00Z`)

    const { page } = await browse(admin.auth, { page: 2, pageSize: 2 })

    expect(page!.events.map((e) => e.at.slice(0, 7))).toEqual(['2026-03', '2026-02'])
    expect(page).toMatchObject({ total: 5, page: 2, pageSize: 2 })
  })

  it('shows patient codes as pseudonyms, since admins do no clinical work', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    await recordExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0204', notes: 'Same as SM-0204 yesterday' })

    const { res, page } = await browse(admin.auth, { action: 'exam-create' })

    expect(JSON.stringify(res.body)).not.toContain('SM-0204')
    expect(page!.events[0]!.changes!.patientCode).toEqual({ from: null, to: expect.stringMatching(/^P-[0-9a-f]{8}$/) })
  })

  it('masks a calibration round’s list of patient codes (round-create) with the same pseudonyms as exams', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const team = await makeTeam()
    const educator = await makeCaller({ roles: ['educator'] })
    const examiners = await Promise.all([0, 1].map(() => makeCaller({ roles: ['resident'], teamIds: [team.id] })))
    const created = await request(app)
      .post('/api/rounds')
      .set('Authorization', educator.auth)
      .send({ name: 'Round of SM-0411', patientCodes: ['SM-0411', 'SM-0412'], examinerIds: examiners.map((e) => e.user.id) })
    expect(created.status).toBe(201)
    await recordExam(app, examiners[0]!.auth, { teamId: team.id, patientCode: 'SM-0411' })

    const { res, page } = await browse(admin.auth, { action: 'round-create' })
    const exams = await browse(admin.auth, { action: 'exam-create' })

    const body = JSON.stringify(res.body).toUpperCase()
    expect(body).not.toContain('SM-0411')
    expect(body).not.toContain('SM-0412')
    const change = page!.events[0]!.changes!.patientCodes as { from: unknown; to: string[] }
    expect(change.from).toBeNull()
    expect(change.to).toEqual([expect.stringMatching(/^P-[0-9a-f]{8}$/), expect.stringMatching(/^P-[0-9a-f]{8}$/)])
    expect(change.to[0]).not.toBe(change.to[1])
    // The pseudonym is the one the exam's own event shows, so the trail stays consistent across entities.
    expect((exams.page!.events[0]!.changes!.patientCode as { to: string }).to).toBe(change.to[0])
  })

  it('answers 400 when the range ends before it starts', async () => {
    const admin = await makeCaller({ roles: ['admin'] })

    const { res } = await browse(admin.auth, { from: '2026-03-01T00:00:00Z', to: '2026-02-01T00:00:00Z' })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['to'])
  })

  it('answers 403 to residents, attendings and educators', async () => {
    const callers = await Promise.all((['resident', 'attending', 'educator'] as const).map((role) => makeCaller({ roles: [role] })))

    const statuses = await Promise.all(callers.map(async (c) => (await browse(c.auth)).res.status))

    expect(statuses).toEqual([403, 403, 403])
  })
})

describe('GET /api/audit/verify', () => {
  it('answers an admin with the walk of the chain over what the server audited', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    await recordSubmittedExam(app, resident.auth, { teamId: team.id })

    const res = await request(app).get('/api/audit/verify').set('Authorization', admin.auth)

    const report = AuditChainReportSchema.parse(res.body)
    expect(res.status).toBe(200)
    expect(report.ok).toBe(true)
    expect(report.checkedRows).toBeGreaterThanOrEqual(2)
    expect(report.head!.seq).toBe(report.checkedRows)
  })

  it('when a row was written around the server, says the chain is broken', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    await eventAt('2026-01-01T08:00:00Z', 'login')

    const res = await request(app).get('/api/audit/verify').set('Authorization', admin.auth)

    expect(res.body).toMatchObject({ ok: false, firstBreak: { kind: 'unchained-row' } })
  })

  it('refuses anyone but an admin', async () => {
    const attending = await makeCaller({ roles: ['attending'] })

    const res = await request(app).get('/api/audit/verify').set('Authorization', attending.auth)

    expect(res.status).toBe(403)
  })
})

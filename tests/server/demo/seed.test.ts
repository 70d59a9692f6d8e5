import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { ExamFindingsSchema, ExamListSchema } from '#shared/schemas/exam'
import { verifyAuditChain } from '../../../server/audit-trail/chain-verify.ts'
import { storedInput } from '../../../server/exams/exam-columns.ts'
import { DEMO_PASSWORD, seedDemo } from '../../../server/demo/seed.ts'
import { AuditEventModel, ExamModel, MembershipModel, TeamModel, UserModel } from '../../../server/models/index.ts'
import { makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let first: Awaited<ReturnType<typeof seedDemo>>

const counts = () =>
  Promise.all([TeamModel.count(), UserModel.count(), MembershipModel.count(), ExamModel.count(), AuditEventModel.count()])

// Seeded once for the file: ten bcrypt hashes at the production cost take seconds.
beforeAll(async () => {
  ;({ app } = await makeTestApp({ demo: true }))
  first = await seedDemo()
})

async function signInAs(email: string) {
  const res = await request(app).post('/api/auth/login').send({ email, password: DEMO_PASSWORD })
  return { res, auth: `Bearer ${res.body.token as string}` }
}

describe('demo seed', () => {
  it('creates the three teams, the named accounts and fifteen exams once, and a second run changes nothing', async () => {
    const before = await counts()

    const second = await seedDemo()

    expect(first.created).toBeGreaterThanOrEqual(10)
    expect(first.exams).toBe(15)
    expect(second).toEqual({ created: 0, exams: 0 })
    expect(await counts()).toEqual(before)
    expect(before[0]).toBe(3)
  })

  it('leaves an audit chain that verifies, the bulk-inserted paired exams included', async () => {
    const report = await verifyAuditChain()

    expect(report.firstBreak).toBeNull()
    expect(report.ok).toBe(true)
    expect(report.checkedRows).toBe(await AuditEventModel.count())
  })

  it('lets the resident sign in with the demo password and puts them on the cardiology ward with the attending', async () => {
    const resident = await signInAs('resident@saltmarsh.test')
    const attending = await signInAs('attending@saltmarsh.test')

    expect(resident.res.status).toBe(200)
    expect(resident.res.body.user.teams).toEqual([expect.objectContaining({ name: 'Ward 7 North — Cardiology' })])
    expect(attending.res.body.user.teams).toEqual(resident.res.body.user.teams)
    expect(attending.res.body.user.roles).toEqual(['attending'])
  })

  it('gives the resident a log of drafts, submitted and countersigned exams with plausible findings', async () => {
    const { auth } = await signInAs('resident@saltmarsh.test')

    const res = await request(app).get('/api/exams').set('Authorization', auth)

    const { exams } = ExamListSchema.parse(res.body)
    expect(exams.length).toBeGreaterThanOrEqual(8)
    expect(new Set(exams.map((e) => e.status))).toEqual(new Set(['draft', 'submitted', 'countersigned']))
    expect(exams.every((e) => /^SM-\d{4}$/.test(e.patientCode) && e.examinerName === 'Dr Sam Whitcombe')).toBe(true)
    expect(exams.every((e) => (e.inclinationDeg >= 30 && e.inclinationDeg <= 60) || e.columnTop === 'not-filled')).toBe(true)
  })
})

describe('demo exams under the current rules', () => {
  const allExams = async () => (await ExamModel.findAll()).map((row) => ({ row, findings: ExamFindingsSchema.safeParse(storedInput(row)) }))

  it('are all valid findings: "not filled" only at 10° or flatter, along the neck only from 30°, a reason when not assessable', async () => {
    const exams = await allExams()

    const invalid = exams.filter((e) => !e.findings.success).map((e) => ({ id: e.row.id, issues: e.findings.error?.issues }))
    expect(invalid).toEqual([])
    const notFilled = exams.filter((e) => e.row.columnTop === 'not-filled')
    expect(notFilled.length).toBeGreaterThan(0)
    expect(notFilled.every((e) => e.row.inclinationDeg <= 10)).toBe(true)
  })

  it('record venous signs as states, never the older list', async () => {
    const rows = await ExamModel.findAll()

    expect(rows.every((row) => !Array.isArray(JSON.parse(row.venousSigns)))).toBe(true)
  })

  it('show context flags, a column not assessable with its reason, and arterial evidence confirmed venous and submitted', async () => {
    const exams = (await allExams()).map((e) => e.findings.data!)
    const rows = await ExamModel.findAll()

    expect(exams.filter((f) => f.context.length > 0).length).toBeGreaterThanOrEqual(2)
    expect(exams.some((f) => f.columnTop === 'not-assessable' && f.notAssessableReason)).toBe(true)
    const arterial = rows.filter((row) => JSON.parse(row.estimate).arterialEvidence === true)
    expect(arterial.length).toBeGreaterThan(0)
    expect(arterial.every((row) => row.venousConfirmed && row.status === 'submitted')).toBe(true)
  })
})

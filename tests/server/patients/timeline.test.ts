import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { PatientTimelineSchema } from '#shared/schemas/timeline'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { makeWard } from '../supervision/ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const HOUR = 60 * 60_000
const hoursAgo = (hours: number) => new Date(Date.now() - hours * HOUR).toISOString()

function timeline(auth: string, code: string) {
  return request(app)
    .get(`/api/patients/${encodeURIComponent(code)}/timeline`)
    .set('Authorization', auth)
}

/** One patient followed by the ward: the resident's exams, a teammate's submitted exam and draft, and another patient's exam. */
async function followedPatient() {
  const ward = await makeWard()
  const teammate = await makeCaller({ teamIds: [ward.team.id] })
  const teamId = ward.team.id
  const late = await recordSubmittedExam(app, ward.resident.auth, { teamId, patientCode: 'TL-1', examinedAt: hoursAgo(2), heightCm: 2 })
  const early = await recordExam(app, ward.resident.auth, { teamId, patientCode: 'TL-1', examinedAt: hoursAgo(50), heightCm: 8 })
  const theirs = await recordSubmittedExam(app, teammate.auth, { teamId, patientCode: 'TL-1', examinedAt: hoursAgo(26), heightCm: 5 })
  const theirDraft = await recordExam(app, teammate.auth, { teamId, patientCode: 'TL-1', examinedAt: hoursAgo(3) })
  await recordSubmittedExam(app, ward.resident.auth, { teamId, patientCode: 'TL-2' })
  await request(app)
    .post(`/api/exams/${late.id}/references`)
    .set('Authorization', ward.attending.auth)
    .send({ kind: 'central-line', value: 4, unit: 'mmHg', measuredAt: late.examinedAt })
  return { ...ward, teammate, early, theirs, late, theirDraft }
}

describe('GET /api/patients/:code/timeline', () => {
  it('gives a resident their own exams and the team’s submitted ones of that code, oldest first, with references', async () => {
    const { resident, early, theirs, late } = await followedPatient()

    const res = await timeline(resident.auth, 'TL-1')

    expect(res.status).toBe(200)
    const body = PatientTimelineSchema.parse(res.body)
    expect(body.patientCode).toBe('TL-1')
    expect(body.exams.map((e) => e.id)).toEqual([early.id, theirs.id, late.id])
    expect(body.exams.every((e) => e.patientCode === 'TL-1' && e.estimate.cvpCmH2O !== null)).toBe(true)
    expect(body.references.map((r) => [r.examId, r.kind, r.paired])).toEqual([[late.id, 'central-line', true]])
    expect(body.caution).toMatch(/estimate/i)
  })

  it('gives the team’s attending every non-draft of the code, and never another examiner’s draft', async () => {
    const { attending, theirs, late, theirDraft } = await followedPatient()

    const body = PatientTimelineSchema.parse((await timeline(attending.auth, 'TL-1')).body)

    expect(body.exams.map((e) => e.id)).toEqual([theirs.id, late.id])
    expect(body.exams.map((e) => e.id)).not.toContain(theirDraft.id)
  })

  it('answers 403 to educators and admins, whose patient codes are masked', async () => {
    await followedPatient()
    const educator = await makeCaller({ roles: ['educator'] })
    const admin = await makeCaller({ roles: ['admin'] })

    const statuses = [(await timeline(educator.auth, 'TL-1')).status, (await timeline(admin.auth, 'TL-1')).status]

    expect(statuses).toEqual([403, 403])
  })

  it('answers 404 to another team’s clinicians and for a code with no exams', async () => {
    const { resident } = await followedPatient()
    const otherTeam = await makeTeam()
    const otherAttending = await makeCaller({ roles: ['attending'], teamIds: [otherTeam.id] })
    const otherResident = await makeCaller({ teamIds: [otherTeam.id] })

    const statuses = [
      (await timeline(otherAttending.auth, 'TL-1')).status,
      (await timeline(otherResident.auth, 'TL-1')).status,
      (await timeline(resident.auth, 'TL-404')).status,
    ]

    expect(statuses).toEqual([404, 404, 404])
  })

  it('answers 400 naming the code when it is not a patient code', async () => {
    const { resident } = await followedPatient()

    const res = await timeline(resident.auth, 'Jane Doe')

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('code')
  })
})

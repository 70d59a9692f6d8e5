import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ReferenceListSchema, ReferenceSchema } from '#shared/schemas/reference'
import { AuditEventModel, ReferenceModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

const MINUTE = 60_000
const minutesFrom = (iso: string, minutes: number) => new Date(new Date(iso).getTime() + minutes * MINUTE).toISOString()

function addReference(auth: string, examId: string, body: object) {
  return request(app).post(`/api/exams/${examId}/references`).set('Authorization', auth).send(body)
}

async function wardExam() {
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })
  return { ...ward, exam }
}

describe('POST /api/exams/:id/references', () => {
  it('stores a central-line value in mmHg with its value in cmH₂O, paired when within the hour of the exam', async () => {
    const { resident, exam } = await wardExam()
    const measuredAt = minutesFrom(exam.examinedAt, 20)

    const res = await addReference(resident.auth, exam.id, { kind: 'central-line', value: 10, unit: 'mmHg', measuredAt })

    expect(res.status).toBe(201)
    const reference = ReferenceSchema.parse(res.body)
    // NIST SP 811 (2008) B.8: 1 mmHg = 133.322387415 Pa, 1 cmH₂O = 98.0665 Pa, so 10 mmHg = 13.5951 cmH₂O.
    expect(reference).toMatchObject({
      examId: exam.id,
      kind: 'central-line',
      value: 10,
      unit: 'mmHg',
      paired: true,
      addedById: resident.user.id,
    })
    expect(reference.valueCmH2O).toBeCloseTo(13.5951, 4)
    expect(reference.measuredAt).toBe(new Date(measuredAt).toISOString())
  })

  it('keeps a value in cmH₂O as it is, and a reference 90 minutes from the exam does not pair', async () => {
    const { resident, exam } = await wardExam()

    const res = await addReference(resident.auth, exam.id, {
      kind: 'catheter-ra',
      value: 7.5,
      unit: 'cmH2O',
      measuredAt: minutesFrom(exam.examinedAt, -90),
    })

    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ valueCmH2O: 7.5, paired: false })
  })

  it('accepts an echocardiographic estimate of 3, 8 or 15 mmHg', async () => {
    const { resident, exam } = await wardExam()

    const res = await addReference(resident.auth, exam.id, { kind: 'echo-ra', value: 15, unit: 'mmHg', measuredAt: exam.examinedAt })

    expect(res.status).toBe(201)
    expect(res.body.valueCmH2O).toBeCloseTo(20.3926, 4)
  })

  it.each([
    ['an echo value other than 3, 8 or 15 mmHg', { kind: 'echo-ra', value: 10, unit: 'mmHg' }, 'value'],
    ['an echo value in cmH₂O', { kind: 'echo-ra', value: 8, unit: 'cmH2O' }, 'unit'],
    ['a unit other than mmHg or cmH₂O', { kind: 'central-line', value: 1, unit: 'kPa' }, 'unit'],
    ['a pressure above 40 mmHg', { kind: 'central-line', value: 41, unit: 'mmHg' }, 'value'],
    ['a pressure below −14 cmH₂O', { kind: 'catheter-ra', value: -15, unit: 'cmH2O' }, 'value'],
    ['no value', { kind: 'central-line', unit: 'mmHg' }, 'value'],
    ['an unknown kind', { kind: 'pcwp', value: 8, unit: 'mmHg' }, 'kind'],
  ])('when given %s, responds 400 naming the field and stores nothing', async (_case, body, field) => {
    const { resident, exam } = await wardExam()

    const res = await addReference(resident.auth, exam.id, { measuredAt: exam.examinedAt, ...body })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty(field)
    expect(await ReferenceModel.count({ where: { examId: exam.id } })).toBe(0)
  })

  it('when the measurement time is in the future, responds 400 naming measuredAt and stores nothing', async () => {
    const { resident, exam } = await wardExam()
    const measuredAt = new Date(Date.now() + 30 * MINUTE).toISOString()

    const res = await addReference(resident.auth, exam.id, { kind: 'central-line', value: 8, unit: 'mmHg', measuredAt })

    expect(res.status).toBe(400)
    expect(res.body.error.fields.measuredAt).toMatch(/future/)
    expect(await ReferenceModel.count()).toBe(0)
  })

  it('answers 404 for an unknown exam and for an exam the caller cannot read', async () => {
    const { exam } = await wardExam()
    const stranger = await makeCaller({ teamIds: [(await makeTeam()).id] })
    const body = { kind: 'central-line', value: 8, unit: 'mmHg', measuredAt: exam.examinedAt }

    const unknown = await addReference(stranger.auth, 'no-such-exam', body)
    const unreadable = await addReference(stranger.auth, exam.id, body)

    expect([unknown.status, unreadable.status]).toEqual([404, 404])
    expect(await ReferenceModel.count()).toBe(0)
  })

  it('lets the team’s attending add one after countersigning, leaves the signature valid and audits the add', async () => {
    const { attending, exam } = await wardExam()
    await act(app, attending.auth, exam, 'countersign', SIGN)

    const res = await addReference(attending.auth, exam.id, { kind: 'central-line', value: 9, unit: 'cmH2O', measuredAt: exam.examinedAt })
    const signed = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', attending.auth)

    expect(res.status).toBe(201)
    expect(signed.body.signatures[0].valid).toBe(true)
    const events = await AuditEventModel.findAll({ where: { entityId: exam.id, action: 'reference-add' } })
    expect(events.map((e) => [e.actorId, JSON.parse(e.changes!).reference.to.valueCmH2O])).toEqual([[attending.user.id, 9]])
  })

  it('refuses an educator, who reads the exam with its code masked, with 403', async () => {
    const { exam } = await wardExam()
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await addReference(educator.auth, exam.id, { kind: 'central-line', value: 8, unit: 'mmHg', measuredAt: exam.examinedAt })

    expect(res.status).toBe(403)
  })
})

describe('GET /api/exams/:id/references', () => {
  it('lists the exam’s references, oldest measurement first, to its readers and 404 to others', async () => {
    const { resident, attending, exam, team } = await wardExam()
    const other = await recordExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0999' })
    await addReference(resident.auth, exam.id, {
      kind: 'central-line',
      value: 8,
      unit: 'mmHg',
      measuredAt: minutesFrom(exam.examinedAt, 10),
    })
    await addReference(attending.auth, exam.id, { kind: 'echo-ra', value: 3, unit: 'mmHg', measuredAt: minutesFrom(exam.examinedAt, -5) })
    await addReference(resident.auth, other.id, { kind: 'central-line', value: 2, unit: 'mmHg', measuredAt: other.examinedAt })
    const stranger = await makeCaller({ teamIds: [(await makeTeam()).id] })

    const res = await request(app).get(`/api/exams/${exam.id}/references`).set('Authorization', attending.auth)
    const refused = await request(app).get(`/api/exams/${exam.id}/references`).set('Authorization', stranger.auth)

    expect(res.status).toBe(200)
    expect(ReferenceListSchema.parse(res.body).references.map((r) => [r.kind, r.addedByName])).toEqual([
      ['echo-ra', 'Dr Tomas Lindqvist'],
      ['central-line', 'Dr Sam Whitcombe'],
    ])
    expect(refused.status).toBe(404)
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamModel } from '../../../server/models/index.ts'
import { makeExamInput, recordExam } from '../factories/exam.ts'
import { makeTestApp } from '../helpers.ts'
import { act, makeWard, recordOf } from '../supervision/ward.ts'
import { push } from '../sync/sync-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let wards = 0

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

// Cook & Simel 1996 (JAMA 275:630–634): a venous pulsation is not palpable and is obliterated by light pressure at the
// base of the neck; a palpable one, or one that persists under light pressure, is arterial evidence.
const PALPABLE = { 'not-palpable': 'absent', 'double-peaked': 'present', 'falls-on-inspiration': 'present' } as const
const PERSISTS = { 'obliterated-by-light-pressure': 'absent', 'double-peaked': 'present', 'falls-on-inspiration': 'present' } as const

async function draftWith(venousSigns: object, venousConfirmed = false) {
  const ward = await makeWard(`Ward ${++wards}`)
  const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, venousSigns, venousConfirmed })
  return { ward, exam }
}

describe('POST /api/exams/:id/submit with arterial evidence', () => {
  it('when the pulsation was palpable and the column is not confirmed venous, responds 400 on venousConfirmed and changes nothing', async () => {
    const { ward, exam } = await draftWith(PALPABLE)
    const before = await recordOf(exam.id)

    const res = await act(app, ward.resident.auth, exam, 'submit', { baseVersion: exam.version })

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('venous-not-confirmed')
    expect(res.body.error.message).toMatch(/confirm that the column you measured is venous/)
    expect(Object.keys(res.body.error.fields)).toEqual(['venousConfirmed'])
    expect(await recordOf(exam.id)).toEqual(before)
  })

  it('when the pulsation persisted under light pressure, also refuses until confirmed', async () => {
    const { ward, exam } = await draftWith(PERSISTS)

    const res = await act(app, ward.resident.auth, exam, 'submit', { baseVersion: exam.version })

    expect(res.status).toBe(400)
    expect(res.body.error.fields.venousConfirmed).toBeTruthy()
  })

  it('once the examiner confirms the column is venous, submits', async () => {
    const { ward, exam } = await draftWith(PALPABLE)
    const confirmed = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', ward.resident.auth)
      .send({ venousConfirmed: true, baseVersion: exam.version })

    const res = await act(app, ward.resident.auth, exam, 'submit', { baseVersion: confirmed.body.version })

    expect(confirmed.status).toBe(200)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ status: 'submitted', venousConfirmed: true })
    expect(res.body.estimate.arterialEvidence).toBe(true)
  })

  it('without arterial evidence (signs not tested), submits without a confirmation', async () => {
    const { ward, exam } = await draftWith({ 'double-peaked': 'present' })

    const res = await act(app, ward.resident.auth, exam, 'submit', { baseVersion: exam.version })

    expect(res.status).toBe(200)
  })

  it('after an amend that withdraws the confirmation, refuses the resubmission', async () => {
    const { ward, exam } = await draftWith(PALPABLE, true)
    const submitted = await act(app, ward.resident.auth, exam, 'submit', { baseVersion: exam.version })
    const returned = await act(app, ward.attending.auth, exam, 'return', { comment: 'Was that the carotid?', baseVersion: submitted.body.version })
    const amended = await act(app, ward.resident.auth, exam, 'amend', { baseVersion: returned.body.version })
    const withdrawn = await request(app)
      .patch(`/api/exams/${exam.id}`)
      .set('Authorization', ward.resident.auth)
      .send({ venousConfirmed: false, baseVersion: amended.body.version })

    const res = await act(app, ward.resident.auth, exam, 'submit', { baseVersion: withdrawn.body.version })

    expect([submitted.status, returned.status, amended.status, withdrawn.status]).toEqual([200, 200, 200, 200])
    expect(res.status).toBe(400)
    expect(res.body.error.fields.venousConfirmed).toBeTruthy()
    expect((await ExamModel.findByPk(exam.id))!.status).toBe('draft')
  })
})

describe('POST /api/sync/push with arterial evidence', () => {
  it('never submits: a pushed exam is stored as a draft whatever status it carries', async () => {
    const ward = await makeWard(`Ward ${++wards}`)
    const exam = { ...makeExamInput({ teamId: ward.team.id, venousSigns: PALPABLE }), status: 'submitted' }

    const res = await push(app, ward.resident.auth, [{ exam, baseVersion: null }])

    expect(res.body.results[0]).toMatchObject({ result: 'applied' })
    expect((await ExamModel.findByPk(exam.id))!.status).toBe('draft')
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamListSchema, type Exam } from '#shared/schemas/exam'
import type { Role } from '#shared/schemas/user'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

/** Two wards; on the cardiology ward a resident with a draft and a submitted exam. */
async function twoWards() {
  const [cardiology, amu] = [await makeTeam('Ward 7 North'), await makeTeam('Acute Medical Unit')]
  const resident = await makeCaller({ teamIds: [cardiology.id] })
  const draft = await recordExam(app, resident.auth, { teamId: cardiology.id, patientCode: 'SM-0142' })
  const submitted = await recordSubmittedExam(app, resident.auth, { teamId: cardiology.id, patientCode: 'SM-0157' })
  const join = (roles: Role[], teamIds: string[] = []) => makeCaller({ roles, teamIds })
  return { cardiology, amu, resident, draft, submitted, join }
}

async function readAs(auth: string, exam: Exam) {
  return request(app).get(`/api/exams/${exam.id}`).set('Authorization', auth)
}

async function listAs(auth: string, query: Record<string, string> = {}) {
  const res = await request(app).get('/api/exams').set('Authorization', auth).query(query)
  return { res, exams: res.status === 200 ? ExamListSchema.parse(res.body).exams : [] }
}

describe('who reads which exams', () => {
  it('a resident reads their own exams, drafts included', async () => {
    const { resident, draft, submitted } = await twoWards()

    const { exams } = await listAs(resident.auth)

    expect(exams.map((e) => e.id).sort()).toEqual([draft.id, submitted.id].sort())
  })

  it('another resident, even on the same ward, gets 404 and an empty list', async () => {
    const { cardiology, submitted, join } = await twoWards()
    const other = await join(['resident'], [cardiology.id])

    const read = await readAs(other.auth, submitted)
    const { exams } = await listAs(other.auth)

    expect(read.status).toBe(404)
    expect(exams).toEqual([])
  })

  it('an attending of the ward reads the submitted exam with its patient code, not the draft', async () => {
    const { cardiology, draft, submitted, join } = await twoWards()
    const attending = await join(['attending'], [cardiology.id])

    const { exams } = await listAs(attending.auth)
    const readDraft = await readAs(attending.auth, draft)

    expect(exams.map((e) => [e.id, e.patientCode])).toEqual([[submitted.id, 'SM-0157']])
    expect(readDraft.status).toBe(404)
  })

  it('an attending reads the submitted exams their ward’s members recorded for another ward', async () => {
    const { cardiology, amu, join } = await twoWards()
    const rotating = await join(['resident'], [cardiology.id, amu.id])
    const elsewhere = await recordSubmittedExam(app, rotating.auth, { teamId: amu.id })
    const attending = await join(['attending'], [cardiology.id])

    const read = await readAs(attending.auth, elsewhere)

    expect(read.status).toBe(200)
  })

  it('an attending of another ward gets 404 and an empty list', async () => {
    const { amu, submitted, join } = await twoWards()
    const attending = await join(['attending'], [amu.id])

    const read = await readAs(attending.auth, submitted)
    const { exams } = await listAs(attending.auth)

    expect(read.status).toBe(404)
    expect(exams).toEqual([])
  })

  it('an educator reads every submitted exam of the program with the patient code masked, never a draft', async () => {
    const { draft, submitted, join } = await twoWards()
    const educator = await join(['educator'])

    const { exams } = await listAs(educator.auth)
    const read = await readAs(educator.auth, submitted)
    const readDraft = await readAs(educator.auth, draft)

    expect(exams.map((e) => e.id)).toEqual([submitted.id])
    expect(read.body.patientCode).toMatch(/^P-[0-9a-f]{8}$/)
    expect(JSON.stringify(read.body)).not.toContain('SM-0157')
    expect(readDraft.status).toBe(404)
  })

  it('an educator reads no notes (they can name any patient); an attending of the team reads them as written', async () => {
    const { cardiology, resident, join } = await twoWards()
    const noted = await recordSubmittedExam(app, resident.auth, {
      teamId: cardiology.id,
      patientCode: 'SM-0171',
      notes: 'Compared with sm-0171 yesterday: column higher.',
    })
    const [educator, attending] = [await join(['educator']), await join(['attending'], [cardiology.id])]

    const asEducator = await readAs(educator.auth, noted)
    const asAttending = await readAs(attending.auth, noted)

    expect(asEducator.body.notes).toBe('')
    expect(JSON.stringify(asEducator.body).toLowerCase()).not.toContain('sm-0171')
    expect(asAttending.body.notes).toBe('Compared with sm-0171 yesterday: column higher.')
  })

  it('masks one patient’s code the same way on every exam, and two patients differently', async () => {
    const { cardiology, resident, submitted, join } = await twoWards()
    const again = await recordSubmittedExam(app, resident.auth, { teamId: cardiology.id, patientCode: 'SM-0157' })
    const otherPatient = await recordSubmittedExam(app, resident.auth, { teamId: cardiology.id, patientCode: 'SM-0163' })
    const educator = await join(['educator'])

    const { exams } = await listAs(educator.auth)

    const codes = new Map(exams.map((e) => [e.id, e.patientCode]))
    expect(codes.get(again.id)).toBe(codes.get(submitted.id))
    expect(codes.get(again.id)).not.toBe(codes.get(otherPatient.id))
  })

  it.each([
    ['searching by patient code', { patientCode: 'SM-0157' }, 'patientCode'],
    ['sorting by patient code', { sort: 'patientCode' }, 'sort'],
  ])('an educator %s gets 400, since the codes are masked', async (_what, query, field) => {
    const { join } = await twoWards()
    const educator = await join(['educator'])

    const { res } = await listAs(educator.auth, query)

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual([field])
  })

  it('an admin gets 403 on the list and 404 on an exam', async () => {
    const { submitted, join } = await twoWards()
    const admin = await join(['admin'])

    const { res } = await listAs(admin.auth)
    const read = await readAs(admin.auth, submitted)

    expect(res.status).toBe(403)
    expect(read.status).toBe(404)
  })

  it('an attending who is also an educator sees their ward’s codes and other wards’ masked', async () => {
    const { cardiology, amu, submitted, join } = await twoWards()
    const amuResident = await join(['resident'], [amu.id])
    const amuExam = await recordSubmittedExam(app, amuResident.auth, { teamId: amu.id, patientCode: 'SM-0204' })
    const both = await join(['attending', 'educator'], [cardiology.id])

    const { exams } = await listAs(both.auth)

    const codes = new Map(exams.map((e) => [e.id, e.patientCode]))
    expect(codes.get(submitted.id)).toBe('SM-0157')
    expect(codes.get(amuExam.id)).toMatch(/^P-/)
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act } from '../supervision/ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

// A code of another patient, typed into free text: masking only this exam's own code would let it through.
const OTHER_PATIENT = 'WD-4471'

/** A submitted exam whose notes, "other" reason and return comment name another patient; an educator of the program. */
async function examNamingAnotherPatient() {
  const team = await makeTeam()
  const resident = await makeCaller({ teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  const educator = await makeCaller({ roles: ['educator'] })
  const exam = await recordSubmittedExam(app, resident.auth, {
    teamId: team.id,
    notes: `Same bay as ${OTHER_PATIENT}; compare with SM-0142 yesterday`,
    columnTop: 'not-assessable',
    notAssessableReason: 'other',
    notAssessableText: `Moved to bed of ${OTHER_PATIENT}`,
  })
  const returned = await act(app, attending.auth, exam, 'return', { comment: `Check against ${OTHER_PATIENT}`, baseVersion: exam.version })
  if (returned.status !== 200) throw new Error(`return: ${returned.status} ${JSON.stringify(returned.body)}`)
  return { resident, educator, exam }
}

/** Every answer an educator may read about the exam. */
async function educatorAnswers(auth: string, examId: string) {
  const get = (path: string) => request(app).get(path).set('Authorization', auth)
  return {
    detail: await get(`/api/exams/${examId}`),
    list: await get('/api/exams'),
    pull: await get('/api/sync/pull'),
    history: await get(`/api/exams/${examId}/history`),
    fhir: await get(`/api/exams/${examId}/fhir`),
    csv: await get('/api/exports/exams.csv'),
  }
}

describe('free text and the educator', () => {
  it('no exam answer, list, pull, history or export an educator reads holds the free text', async () => {
    const { educator, exam } = await examNamingAnotherPatient()

    const answers = await educatorAnswers(educator.auth, exam.id)

    for (const [name, res] of Object.entries(answers)) {
      expect(res.status, name).toBe(200)
      expect(JSON.stringify(res.body) + res.text, name).not.toContain(OTHER_PATIENT)
    }
    expect(answers.detail.body).toMatchObject({ notes: '', returnComment: null })
    expect(answers.detail.body.notAssessableText ?? null).toBeNull()
    expect(answers.list.body.exams.map((e: { id: string }) => e.id)).toContain(exam.id)
  })

  it('the author still reads the notes as written', async () => {
    const { resident, exam } = await examNamingAnotherPatient()

    const res = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', resident.auth)

    expect(res.body.notes).toContain(OTHER_PATIENT)
    expect(res.body.returnComment).toContain(OTHER_PATIENT)
  })
})

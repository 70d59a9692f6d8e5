import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamModel } from '../../../server/models/index.ts'
import { makeExamInput } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function residentOnTeam() {
  const team = await makeTeam()
  return { team, resident: await makeCaller({ teamIds: [team.id] }) }
}

describe('POST /api/exams: values read back as sent', () => {
  it.each(['0000-01-01T00:00:00Z', '0099-12-31T23:59:59Z', '1899-12-31T12:00:00Z', '2101-01-01T00:00:00Z'])(
    'when examinedAt is %s, responds 400 naming examinedAt and stores nothing',
    async (examinedAt) => {
      const { team, resident } = await residentOnTeam()
      const input = makeExamInput({ teamId: team.id, examinedAt })

      const res = await request(app).post('/api/exams').set('Authorization', resident.auth).send(input)

      expect(res.status).toBe(400)
      expect(res.body.error.fields).toEqual({ examinedAt: 'Use a date between 1900 and 2100' })
      expect(await ExamModel.count({ where: { id: input.id } })).toBe(0)
    },
  )

  it('stores a time at the edge of the range and reads it back unchanged; a retry is the same exam', async () => {
    const { team, resident } = await residentOnTeam()
    const input = makeExamInput({ teamId: team.id, examinedAt: '1900-01-01T00:00:00.000Z' })
    const post = () => request(app).post('/api/exams').set('Authorization', resident.auth).send(input)

    const first = await post()
    const retry = await post()

    expect(first.status).toBe(201)
    expect(first.body.examinedAt).toBe('1900-01-01T00:00:00.000Z')
    expect(retry.status).toBe(200)
  })

  it('takes one UUID in upper and lower case as one exam, stored in lower case', async () => {
    const { team, resident } = await residentOnTeam()
    const input = makeExamInput({ teamId: team.id })

    const upper = await request(app)
      .post('/api/exams')
      .set('Authorization', resident.auth)
      .send({ ...input, id: input.id.toUpperCase() })
    const lower = await request(app).post('/api/exams').set('Authorization', resident.auth).send(input)

    expect(upper.status).toBe(201)
    expect(upper.body.id).toBe(input.id)
    expect(lower.status).toBe(200)
    expect(await ExamModel.count({ where: { patientCode: input.patientCode, teamId: team.id } })).toBe(1)
  })
})

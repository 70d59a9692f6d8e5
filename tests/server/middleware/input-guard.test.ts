import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamModel } from '../../../server/models/index.ts'
import { makeExamInput, recordExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function residentOnTeam() {
  const team = await makeTeam()
  return { team, resident: await makeCaller({ teamIds: [team.id] }) }
}

describe('path ids under /api', () => {
  it.each([
    ['a NUL character', '/api/exams/a%00b'],
    ['a line feed', '/api/exams/a%0Ab'],
    ['a malformed percent-encoding', '/api/exams/%ff'],
    ['a cut-off percent-encoding', '/api/rounds/abc%'],
    ['more than 64 characters', `/api/exams/${'a'.repeat(65)}`],
    ['a NUL character, under /API in capitals', '/API/exams/a%00b'],
  ])('when an id holds %s, responds 400 naming the path', async (_case, path) => {
    const { resident } = await residentOnTeam()

    const res = await request(app).get(path).set('Authorization', resident.auth)

    expect(res.status).toBe(400)
    expect(res.body.error).toMatchObject({ code: 'invalid-path', fields: { path: expect.any(String) } })
  })

  it('reads an exam by its UUID written in upper case', async () => {
    const { team, resident } = await residentOnTeam()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })

    const res = await request(app).get(`/api/exams/${exam.id.toUpperCase()}`).set('Authorization', resident.auth)

    expect(res.status).toBe(200)
    expect(res.body.id).toBe(exam.id)
  })
})

describe('query strings under /api', () => {
  it.each([
    ['/api/exams', 'patientCode', ['resident']],
    ['/api/exports/exams.csv', 'patientCode', ['resident']],
    ['/api/audit', 'action', ['admin']],
    ['/api/audit', 'entityId', ['admin']],
    ['/api/admin/accounts', 'search', ['admin']],
  ] as const)('GET %s?%s= with a NUL character responds 400 naming the parameter', async (path, param, roles) => {
    const caller = await makeCaller({ roles: [...roles] })

    const res = await request(app).get(`${path}?${param}=SM%000142`).set('Authorization', caller.auth)

    expect(res.status).toBe(400)
    expect(res.body.error).toMatchObject({ code: 'invalid-input', fields: { [param]: expect.stringMatching(/control characters/) } })
  })
})

describe('JSON bodies under /api', () => {
  it('when a text field holds a NUL character, responds 400 naming the field and stores nothing', async () => {
    const { team, resident } = await residentOnTeam()
    const input = makeExamInput({ teamId: team.id, notes: 'left\u0000right' })

    const res = await request(app).post('/api/exams').set('Authorization', resident.auth).send(input)

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toEqual({ notes: expect.stringMatching(/control characters/) })
    expect(await ExamModel.count({ where: { id: input.id } })).toBe(0)
  })

  it('keeps tabs and line breaks in free text', async () => {
    const { team, resident } = await residentOnTeam()

    const res = await request(app)
      .post('/api/exams')
      .set('Authorization', resident.auth)
      .send(makeExamInput({ teamId: team.id, notes: 'first line\r\n\tsecond line' }))

    expect(res.status).toBe(201)
    expect(res.body.notes).toBe('first line\r\n\tsecond line')
  })

  it('when a value nests deeper than any request needs, responds 400', async () => {
    const { resident } = await residentOnTeam()
    let deep: unknown = 'x'
    for (let i = 0; i < 100; i++) deep = [deep]

    const res = await request(app).post('/api/estimate').set('Authorization', resident.auth).send({ venousSigns: deep })

    expect(res.status).toBe(400)
    expect(Object.values(res.body.error.fields)).toContainEqual(expect.stringMatching(/nest at most/))
  })
})

import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { AttachmentModel } from '../../../server/models/index.ts'
import { recordExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

describe('POST /api/exams/:id/attachments with a form that cannot be read', () => {
  it.each([
    [
      'no closing boundary',
      'multipart/form-data; boundary=XYZ',
      '--XYZ\r\nContent-Disposition: form-data; name="file"; filename="a.jpg"\r\n\r\nabc',
    ],
    ['no boundary at all', 'multipart/form-data', '--XYZ\r\n'],
    ['a broken part header', 'multipart/form-data; boundary=XYZ', '--XYZ\r\nContent-Disposition\r\n\r\nabc\r\n--XYZ--\r\n'],
  ])('with %s, responds 400 naming the file and stores nothing', async (_case, contentType, body) => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    const exam = await recordExam(app, resident.auth, { teamId: team.id })

    const res = await request(app)
      .post(`/api/exams/${exam.id}/attachments`)
      .set('Authorization', resident.auth)
      .set('Content-Type', contentType)
      .send(body)

    expect(res.status).toBe(400)
    expect(res.body.error).toMatchObject({ code: 'invalid-input', fields: { file: expect.any(String) } })
    expect(await AttachmentModel.count({ where: { examId: exam.id } })).toBe(0)
  })
})

import { createHash } from 'node:crypto'
import { rmSync } from 'node:fs'
import request from 'supertest'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { AttachmentListSchema } from '#shared/schemas/attachment'
import { AttachmentModel, AuditEventModel } from '../../../server/models/index.ts'
import { recordExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'
import { allowPhotos, makeDataDir, makePhoto, upload } from './photos.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let data: ReturnType<typeof makeDataDir>

beforeEach(async () => {
  data = makeDataDir()
  ;({ app } = await makeTestApp({ attachmentsDir: data.dir }))
  await allowPhotos(true)
})

afterEach(() => {
  rmSync(data.root, { recursive: true, force: true })
})

const get = (path: string, auth: string) => request(app).get(path).set('Authorization', auth).buffer(true)
const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex')

/** A ward's resident attaches a JPEG, a PNG and a WebP to a draft and submits it; readers of several kinds around it. */
async function submittedWithPhotos() {
  const ward = await makeWard()
  const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
  const photos = []
  for (const format of ['jpeg', 'png', 'webp'] as const) photos.push((await upload(app, ward.resident.auth, exam.id, await makePhoto(format))).body)
  await act(app, ward.resident.auth, exam, 'submit', { baseVersion: exam.version }).expect(200)
  const otherTeam = await makeTeam('Medical ICU')
  const strangerAttending = await makeCaller({ roles: ['attending'], teamIds: [otherTeam.id] })
  const strangerResident = await makeCaller({ teamIds: [otherTeam.id] })
  const educator = await makeCaller({ roles: ['educator'] })
  const admin = await makeCaller({ roles: ['admin'] })
  return { ...ward, exam, photos, strangerAttending, strangerResident, educator, admin }
}

describe('GET /api/attachments/:id and /api/exams/:id/attachments', () => {
  it('serves each photo to its author and to the team’s attending, byte for byte as stored, with its type and safe headers', async () => {
    const { resident, attending, exam, photos } = await submittedWithPhotos()

    for (const reader of [resident, attending]) {
      const list = await get(`/api/exams/${exam.id}/attachments`, reader.auth)
      expect(list.status).toBe(200)
      expect(AttachmentListSchema.parse(list.body).attachments.map((a) => a.mimeType)).toEqual(['image/jpeg', 'image/png', 'image/webp'])
      for (const photo of photos) {
        const res = await get(`/api/attachments/${photo.id}`, reader.auth)

        expect(res.status).toBe(200)
        expect(res.headers['content-type']).toBe(photo.mimeType)
        expect(res.headers['x-content-type-options']).toBe('nosniff')
        expect(res.headers['content-disposition']).toBe(`inline; filename="${photo.displayName}"`)
        expect(res.headers['cache-control']).toBe('private, no-store')
        expect(sha256(res.body as Buffer)).toBe(photo.sha256)
      }
    }
  })

  it('answers 404 to another team’s attending and resident, and to an admin, as the exam API does', async () => {
    const { exam, photos, strangerAttending, strangerResident, admin } = await submittedWithPhotos()

    for (const outsider of [strangerAttending, strangerResident, admin]) {
      expect((await get(`/api/exams/${exam.id}`, outsider.auth)).status).not.toBe(200)
      const list = await get(`/api/exams/${exam.id}/attachments`, outsider.auth)
      const file = await get(`/api/attachments/${photos[0].id}`, outsider.auth)

      // Admins hold no reading role at all, so the role guard answers them first.
      expect(list.status).toBe(outsider === admin ? 403 : 404)
      expect(file.status).toBe(outsider === admin ? 403 : 404)
      expect(file.headers['content-type']).toMatch(/json/)
    }
  })

  it('answers 403 photos-hidden to an educator, who reads the exam only with the patient code masked', async () => {
    const { exam, photos, educator } = await submittedWithPhotos()

    const examRes = await get(`/api/exams/${exam.id}`, educator.auth)
    const list = await get(`/api/exams/${exam.id}/attachments`, educator.auth)
    const file = await get(`/api/attachments/${photos[0].id}`, educator.auth)

    // Decision: a photo of a neck can identify the patient, so it follows the patient code, which educators never see.
    expect(examRes.status).toBe(200)
    expect(examRes.body.patientCode).not.toBe('SM-0142')
    expect(list.status).toBe(403)
    expect(file.status).toBe(403)
    expect(file.body.error.code).toBe('photos-hidden')
  })

  it('keeps a draft’s photos from the attending until it is submitted, as the draft itself', async () => {
    const ward = await makeWard()
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
    const photo = (await upload(app, ward.resident.auth, exam.id, await makePhoto('jpeg'))).body

    expect((await get(`/api/attachments/${photo.id}`, ward.attending.auth)).status).toBe(404)
    expect((await get(`/api/attachments/${photo.id}`, ward.resident.auth)).status).toBe(200)
  })

  it('answers 404 for an unknown photo id, and for a path in place of an id', async () => {
    const { resident } = await submittedWithPhotos()

    expect((await get('/api/attachments/00000000-0000-0000-0000-000000000000', resident.auth)).status).toBe(404)
    expect((await get(`/api/attachments/${encodeURIComponent('../../plumbline.sqlite')}`, resident.auth)).status).toBe(404)
  })

  it('still serves stored photos after an admin switches photos off; only new ones are refused', async () => {
    const { resident, exam, photos } = await submittedWithPhotos()

    await allowPhotos(false)

    expect((await get(`/api/attachments/${photos[0].id}`, resident.auth)).status).toBe(200)
    expect((await get(`/api/exams/${exam.id}/attachments`, resident.auth)).body.attachments).toHaveLength(3)
  })
})

describe('DELETE /api/attachments/:id', () => {
  it('lets the author remove a photo from a draft: the file goes, the row keeps who and which hash, and the removal is audited', async () => {
    const { resident, team } = await makeWard()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    const photo = (await upload(app, resident.auth, exam.id, await makePhoto('jpeg'))).body
    expect(data.files()).toHaveLength(1)

    const res = await request(app).delete(`/api/attachments/${photo.id}`).set('Authorization', resident.auth)

    expect(res.status).toBe(204)
    expect(data.files()).toEqual([])
    expect((await AttachmentModel.findByPk(photo.id))!.deletedAt).not.toBeNull()
    expect((await get(`/api/attachments/${photo.id}`, resident.auth)).status).toBe(404)
    expect((await get(`/api/exams/${exam.id}/attachments`, resident.auth)).body.attachments).toEqual([])
    const events = await AuditEventModel.findAll({ where: { entityId: exam.id, action: 'attachment-delete' } })
    expect(events.map((e) => ({ actorId: e.actorId, changes: JSON.parse(e.changes!) }))).toEqual([
      { actorId: resident.user.id, changes: { attachmentId: photo.id, sha256: photo.sha256 } },
    ])
  })

  it('keeps photos of a submitted or countersigned exam immutable (409), even after the exam is amended', async () => {
    const { resident, attending, exam, photos } = await submittedWithPhotos()
    const photo = await makePhoto('jpeg')

    const addWhileSubmitted = await upload(app, resident.auth, exam.id, photo)
    await act(app, attending.auth, exam, 'countersign', SIGN).expect(200)
    const addWhileSigned = await upload(app, resident.auth, exam.id, photo)
    const removeWhileSigned = await request(app).delete(`/api/attachments/${photos[0].id}`).set('Authorization', resident.auth)
    await act(app, resident.auth, exam, 'amend', {}).expect(200)
    const removeAfterAmend = await request(app).delete(`/api/attachments/${photos[0].id}`).set('Authorization', resident.auth)
    const addAfterAmend = await upload(app, resident.auth, exam.id, photo)

    expect(addWhileSubmitted.status).toBe(409)
    expect(addWhileSigned.status).toBe(409)
    expect(addWhileSigned.body.error.code).toBe('attachments-locked')
    expect(removeWhileSigned.status).toBe(409)
    // Amending reopens the exam as a draft: what was signed stays; a new photo may join the new version.
    expect(removeAfterAmend.status).toBe(409)
    expect(removeAfterAmend.body.error.message).toMatch(/countersigned/)
    expect(addAfterAmend.status).toBe(201)
    expect(data.files()).toHaveLength(4)
    expect(await AttachmentModel.count({ where: { examId: exam.id, deletedAt: null } })).toBe(4)
  })

  it('lets only the author remove: the attending gets 403, another team 404', async () => {
    const { resident, attending, team, strangerResident } = { ...(await makeWard()), strangerResident: await makeCaller({ teamIds: [(await makeTeam()).id] }) }
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    const photo = (await upload(app, resident.auth, exam.id, await makePhoto('jpeg'))).body
    // The attending reads the exam once it is returned to the author (editable again), not while it is a draft.
    await act(app, resident.auth, exam, 'submit', { baseVersion: exam.version }).expect(200)
    await act(app, attending.auth, exam, 'return', { comment: 'Please re-measure at 45°' }).expect(200)

    const byAttending = await request(app).delete(`/api/attachments/${photo.id}`).set('Authorization', attending.auth)
    const byStranger = await request(app).delete(`/api/attachments/${photo.id}`).set('Authorization', strangerResident.auth)

    expect(byAttending.status).toBe(403)
    expect(byStranger.status).toBe(404)
    expect(data.files()).toHaveLength(1)
  })
})

import { randomUUID } from 'node:crypto'
import { readdirSync, readFileSync, rmSync } from 'node:fs'
import path from 'node:path'
import sharp from 'sharp'
import request from 'supertest'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { AttachmentSchema } from '#shared/schemas/attachment'
import { AttachmentModel, AuditEventModel } from '../../../server/models/index.ts'
import { recordExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { allowPhotos, GPS_IFD_POINTER, ifd0Tags, makeDataDir, makePhoneJpeg, makePhoto, upload } from './photos.ts'

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

async function draftOfResident() {
  const team = await makeTeam()
  const resident = await makeCaller({ teamIds: [team.id] })
  const exam = await recordExam(app, resident.auth, { teamId: team.id })
  return { team, resident, exam }
}

const rowsOf = (examId: string) => AttachmentModel.count({ where: { examId } })

describe('POST /api/exams/:id/attachments — what is accepted', () => {
  it.each([
    ['jpeg', 'image/jpeg'],
    ['png', 'image/png'],
    ['webp', 'image/webp'],
  ] as const)('stores a %s photo under a random name, with the type read from its bytes', async (format, mime) => {
    const { resident, exam } = await draftOfResident()
    const photo = await makePhoto(format)

    // The sender's type and name both lie; the bytes decide.
    const res = await upload(app, resident.auth, exam.id, photo, { filename: 'set-up.bin', contentType: 'application/octet-stream' })

    expect(res.status).toBe(201)
    const stored = AttachmentSchema.parse(res.body)
    expect(stored).toMatchObject({ examId: exam.id, mimeType: mime, width: 64, height: 48, createdBy: resident.user.id, consentConfirmedBy: resident.user.id })
    const row = (await AttachmentModel.findByPk(stored.id))!
    expect(row.storedName).toMatch(/^[0-9a-f-]{36}\.(jpg|png|webp)$/)
    expect(data.files()).toEqual([row.storedName])
    const onDisk = readFileSync(path.join(data.dir, row.storedName))
    expect(onDisk.length).toBe(stored.byteSize)
    expect((await sharp(onDisk).metadata()).format).toBe(format)
  })

  it('audits the addition: who, which exam, the type, size and hash of what was stored, and the consent', async () => {
    const { resident, exam } = await draftOfResident()

    const res = await upload(app, resident.auth, exam.id, await makePhoto('jpeg'))

    const events = await AuditEventModel.findAll({ where: { entityId: exam.id, action: 'attachment-add' } })
    expect(events).toHaveLength(1)
    expect(events[0]!.actorId).toBe(resident.user.id)
    expect(JSON.parse(events[0]!.changes!)).toEqual({
      attachmentId: res.body.id,
      mimeType: 'image/jpeg',
      byteSize: res.body.byteSize,
      sha256: res.body.sha256,
      consentConfirmed: true,
    })
  })

  it('stores one photo when an upload is retried with the same client id (the first answer was lost)', async () => {
    const { resident, exam } = await draftOfResident()
    const photo = await makePhoto('png')
    const id = randomUUID()

    const first = await upload(app, resident.auth, exam.id, photo, { id })
    const retry = await upload(app, resident.auth, exam.id, photo, { id })

    expect([first.status, retry.status]).toEqual([201, 200])
    expect(retry.body).toEqual(first.body)
    expect(await rowsOf(exam.id)).toBe(1)
    expect(data.files()).toHaveLength(1)
    expect(await AuditEventModel.count({ where: { entityId: exam.id, action: 'attachment-add' } })).toBe(1)
  })
})

describe('POST /api/exams/:id/attachments — what is refused', () => {
  it.each([
    ['a text file', Buffer.from('Patient SM-0142: JVP 4 cm\n'.repeat(20))],
    ['an HTML page', Buffer.from('<!doctype html><html><body><script>alert(document.cookie)</script></body></html>')],
    ['an SVG image', Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>')],
  ])('answers 415 for %s renamed .jpg and sent as image/jpeg, and stores nothing', async (_what, bytes) => {
    const { resident, exam } = await draftOfResident()

    const res = await upload(app, resident.auth, exam.id, bytes, { filename: 'neck.jpg', contentType: 'image/jpeg' })

    expect(res.status).toBe(415)
    expect(res.body.error).toMatchObject({ code: 'unsupported-type', fields: { file: expect.any(String) } })
    expect(await rowsOf(exam.id)).toBe(0)
    expect(data.files()).toEqual([])
  })

  it('answers 415 for a real GIF: only JPEG, PNG and WebP are photos here', async () => {
    const { resident, exam } = await draftOfResident()

    const res = await upload(app, resident.auth, exam.id, await makePhoto('gif'), { filename: 'neck.gif', contentType: 'image/gif' })

    expect(res.status).toBe(415)
    expect(res.body.error.fields.file).toMatch(/image\/gif/)
  })

  it('answers 413 for a photo over 5 MB, and stores nothing', async () => {
    const { resident, exam } = await draftOfResident()
    const big = Buffer.concat([await makePhoto('jpeg'), Buffer.alloc(5 * 1024 * 1024)])

    const res = await upload(app, resident.auth, exam.id, big)

    expect(res.status).toBe(413)
    expect(res.body.error).toMatchObject({ code: 'too-large', fields: { file: expect.stringMatching(/5 MB/) } })
    expect(await rowsOf(exam.id)).toBe(0)
    expect(data.files()).toEqual([])
  })

  it('accepts a photo of exactly 5 MB: the limit is inclusive', async () => {
    const { resident, exam } = await draftOfResident()
    const photo = await makePhoto('jpeg')
    // Bytes after the JPEG's end-of-image marker are ignored by decoders.
    const exact = Buffer.concat([photo, Buffer.alloc(5 * 1024 * 1024 - photo.length)])

    const res = await upload(app, resident.auth, exam.id, exact)

    expect(res.status).toBe(201)
  })

  it.each([
    ['missing', null],
    ['not ticked', 'false'],
  ])('answers 400 on the field consent when the consent is %s', async (_how, consent) => {
    const { resident, exam } = await draftOfResident()

    const res = await upload(app, resident.auth, exam.id, await makePhoto('jpeg'), { consent })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toEqual({ consent: 'Confirm that the patient consented to the photo' })
    expect(await rowsOf(exam.id)).toBe(0)
  })

  it('answers 400 on the field file when no photo is sent', async () => {
    const { resident, exam } = await draftOfResident()

    const res = await request(app).post(`/api/exams/${exam.id}/attachments`).set('Authorization', resident.auth).field('consent', 'true')

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toEqual({ file: 'Choose a photo to attach' })
  })

  it('refuses a fifth photo with 409, and takes one again once a photo is removed', async () => {
    const { resident, exam } = await draftOfResident()
    const photo = await makePhoto('webp')
    const ids: string[] = []
    for (let i = 0; i < 4; i++) ids.push((await upload(app, resident.auth, exam.id, photo)).body.id)

    const fifth = await upload(app, resident.auth, exam.id, photo)

    expect(fifth.status).toBe(409)
    expect(fifth.body.error).toMatchObject({ code: 'attachment-limit', message: expect.stringMatching(/at most 4 photos/) })
    expect(await rowsOf(exam.id)).toBe(4)
    expect(data.files()).toHaveLength(4)

    await request(app).delete(`/api/attachments/${ids[0]}`).set('Authorization', resident.auth).expect(204)
    const again = await upload(app, resident.auth, exam.id, photo)

    expect(again.status).toBe(201)
    expect(data.files()).toHaveLength(4)
  })

  it('answers 403 with a clear message when photos are switched off, and stores nothing', async () => {
    const { resident, exam } = await draftOfResident()
    await allowPhotos(false)

    const res = await upload(app, resident.auth, exam.id, await makePhoto('jpeg'))

    expect(res.status).toBe(403)
    expect(res.body.error).toMatchObject({ code: 'photos-disabled', message: expect.stringMatching(/switched off/) })
    expect(await rowsOf(exam.id)).toBe(0)
  })

  it('lets only the author attach: a colleague who reads the exam gets 403, another team 404', async () => {
    const { team, resident, exam } = await draftOfResident()
    await request(app).post(`/api/exams/${exam.id}/submit`).set('Authorization', resident.auth).expect(200)
    const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
    const stranger = await makeCaller({ roles: ['attending'], teamIds: [(await makeTeam()).id] })
    const photo = await makePhoto('jpeg')

    const byColleague = await upload(app, attending.auth, exam.id, photo)
    const byStranger = await upload(app, stranger.auth, exam.id, photo)

    expect(byColleague.status).toBe(403)
    expect(byStranger.status).toBe(404)
    expect(await rowsOf(exam.id)).toBe(0)
  })
})

describe('POST /api/exams/:id/attachments — what is stored', () => {
  it('strips EXIF (GPS position, camera) and applies the orientation to the pixels', async () => {
    const { resident, exam } = await draftOfResident()
    const phone = await makePhoneJpeg()
    const sent = await sharp(phone).metadata()
    // The test photo really carries the GPS block and the orientation flag before upload.
    expect(ifd0Tags(sent.exif!)).toContain(GPS_IFD_POINTER)
    expect(sent).toMatchObject({ orientation: 6, width: 64, height: 48 })

    const res = await upload(app, resident.auth, exam.id, phone)
    const served = await request(app).get(`/api/attachments/${res.body.id}`).set('Authorization', resident.auth).buffer(true)

    expect(res.status).toBe(201)
    const kept = await sharp(served.body as Buffer).metadata()
    expect(kept.exif).toBeUndefined()
    expect(kept.xmp).toBeUndefined()
    expect(kept.orientation).toBeUndefined()
    expect({ width: kept.width, height: kept.height }).toEqual({ width: 48, height: 64 })
    expect(res.body).toMatchObject({ width: 48, height: 64 })
    expect((served.body as Buffer).includes(Buffer.from('Saltmarsh Test Camera'))).toBe(false)
  })

  it('keeps a path-traversal file name harmless: a random name inside the folder, nothing written outside', async () => {
    const { resident, exam } = await draftOfResident()

    const res = await upload(app, resident.auth, exam.id, await makePhoto('jpeg'), { filename: '../../etc/passwd.jpg' })

    expect(res.status).toBe(201)
    expect(res.body.displayName).toBe('passwd.jpg')
    const row = (await AttachmentModel.findByPk(res.body.id))!
    expect(row.storedName).toMatch(/^[0-9a-f-]{36}\.jpg$/)
    expect(data.files()).toEqual([row.storedName])
    expect(readdirSync(data.root)).toEqual(['attachments'])
  })

  it('cleans a display name of quotes and control characters so it cannot break the Content-Disposition header', async () => {
    const { resident, exam } = await draftOfResident()

    const res = await upload(app, resident.auth, exam.id, await makePhoto('png'), { filename: 'bed "7"\r\nSet-Cookie: x=1.exe' })
    const served = await request(app).get(`/api/attachments/${res.body.id}`).set('Authorization', resident.auth)

    expect(res.body.displayName).toMatch(/^[A-Za-z0-9 _-]+\.png$/)
    expect(served.headers['content-disposition']).toBe(`inline; filename="${res.body.displayName}"`)
    expect(served.headers['set-cookie']).toBeUndefined()
  })
})

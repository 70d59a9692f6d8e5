import request from 'supertest'
import sharp from 'sharp'
import { afterEach, describe, expect, it } from 'vitest'
import { ROSTER_MAX_BYTES, ROSTER_MAX_ROWS } from '#shared/schemas/roster'
import { accountsSnapshot, auditActions, hospitalWithMail, upload } from './roster-helpers.ts'

const cleanups: (() => unknown)[] = []

afterEach(async () => {
  for (const cleanup of cleanups.splice(0).reverse()) await cleanup()
})

const HEADER = 'email,display name,roles,team\n'
const row = (i: number) => `person${i}@saltmarsh.test,Dr Person ${i},resident,Medical ICU\n`

/** Sends the file to both steps and checks that neither wrote anything; returns the preview's answer. */
async function refusedByBoth(content: Buffer | string, filename = 'roster.csv') {
  const { app, admin, fake, mailer } = await hospitalWithMail(cleanups)
  const accounts = await accountsSnapshot()

  const preview = await upload(app, admin.auth, 'preview', content, filename)
  const apply = await upload(app, admin.auth, 'apply', content, filename)
  await mailer.idle()

  expect(apply.status).toBe(preview.status)
  expect(apply.body).toEqual(preview.body)
  expect(await accountsSnapshot()).toEqual(accounts)
  expect(await auditActions()).toEqual([])
  expect(fake.messages()).toEqual([])
  return preview
}

describe('roster upload: files that are not a UTF-8 CSV roster change nothing', () => {
  it('a PNG image renamed .csv (and sent as text/csv) → 415 naming what it is', async () => {
    const png = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#1F5C63' } }).png().toBuffer()

    const res = await refusedByBoth(png, 'roster.csv')

    expect(res.status).toBe(415)
    expect(res.body.error.code).toBe('roster-not-csv')
    expect(res.body.error.message).toContain('This file is a PNG image, not a CSV text file.')
    expect(res.body.error.fields.file).toBe(res.body.error.message)
  })

  it('binary data without a known signature (a NUL byte) → 415', async () => {
    const res = await refusedByBoth(Buffer.concat([Buffer.from(HEADER), Buffer.from([0x00, 0x01, 0x02]), Buffer.from(row(1))]))

    expect(res.status).toBe(415)
    expect(res.body.error.message).toContain(`NUL byte at byte ${HEADER.length + 1}`)
  })

  it('Windows-1252 text (invalid UTF-8) → 415 naming the encoding and the line', async () => {
    // "Dr José Núñez" in Windows-1252: é = 0xE9, ú = 0xFA, ñ = 0xF1 (the code page's published table).
    const latin = Buffer.concat([Buffer.from(`${HEADER}${row(1)}jose@saltmarsh.test,Dr Jos`), Buffer.from([0xe9]), Buffer.from(' N'), Buffer.from([0xfa, 0xf1]), Buffer.from('ez,resident,\n')])

    const res = await refusedByBoth(latin)

    expect(res.status).toBe(415)
    expect(res.body.error.code).toBe('roster-encoding')
    expect(res.body.error.message).toContain('not valid UTF-8')
    expect(res.body.error.message).toContain('byte 0xE9 on line 3')
  })

  it('a file over 1 MB → 413 with a message naming the limit', async () => {
    const big = HEADER + 'x'.repeat(ROSTER_MAX_BYTES)

    const res = await refusedByBoth(big)

    expect(res.status).toBe(413)
    expect(res.body.error).toMatchObject({ code: 'roster-too-large', message: 'The file is larger than 1 MB; a roster must be at most 1 MB.' })
  })

  it(`more than ${ROSTER_MAX_ROWS} rows → 413`, async () => {
    const many = HEADER + Array.from({ length: ROSTER_MAX_ROWS + 1 }, (_, i) => row(i)).join('')

    const res = await refusedByBoth(many)

    expect(res.status).toBe(413)
    expect(res.body.error.code).toBe('roster-too-many-rows')
  })

  it('no header row → 400', async () => {
    const res = await refusedByBoth(row(1) + row(2))

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('roster-no-header')
  })

  it('a header without rows → 400', async () => {
    const res = await refusedByBoth(HEADER)

    expect(res.status).toBe(400)
    expect(res.body.error.message).toBe('The file has a header row but no accounts below it.')
  })

  it('an empty file → 400', async () => {
    const res = await refusedByBoth('')

    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('roster-empty')
  })

  it('an unclosed quote → 400 naming the line', async () => {
    const res = await refusedByBoth(`${HEADER}${row(1)}x@saltmarsh.test,"Dr X,resident,\n${row(3)}`)

    expect(res.status).toBe(400)
    expect(res.body.error.message).toBe('The file is not well-formed CSV: on line 3, a quoted value is never closed.')
  })
})

describe('roster upload: the form itself', () => {
  it('no file → 400 on the file field', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)

    const res = await request(app).post('/api/admin/roster/preview').set('Authorization', admin.auth).send({})

    expect(res.status).toBe(400)
    expect(res.body.error.fields.file).toContain('Choose a CSV file')
  })

  it('a file under another field name, or two files → 400', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)
    const csv = Buffer.from(HEADER + row(1))

    const wrongField = await request(app).post('/api/admin/roster/preview').set('Authorization', admin.auth).attach('roster', csv, 'r.csv')
    const two = await request(app)
      .post('/api/admin/roster/preview')
      .set('Authorization', admin.auth)
      .attach('file', csv, 'a.csv')
      .attach('file', csv, 'b.csv')

    expect(wrongField.status).toBe(400)
    expect(two.status).toBe(400)
    expect(two.body.error.message).toBe('Send exactly one CSV file, in the form field "file".')
  })

  it('judges by the bytes, not the name: a CSV called roster.png is read as a roster', async () => {
    const { app, admin } = await hospitalWithMail(cleanups)

    const res = await upload(app, admin.auth, 'preview', HEADER + row(1), 'roster.png')

    expect(res.status).toBe(200)
    expect(res.body.counts.new).toBe(1)
  })
})

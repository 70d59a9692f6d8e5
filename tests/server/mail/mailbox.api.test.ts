import request from 'supertest'
import { afterEach, describe, expect, it } from 'vitest'
import { startFakeSmtp, type FakeSmtp } from '../../../server/mail/fake-smtp.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'

let fake: FakeSmtp | undefined

afterEach(async () => {
  await fake?.close()
  fake = undefined
})

describe('GET /api/mailbox', () => {
  it('when the demo SMTP catcher runs, answers an admin and refuses a resident', async () => {
    fake = await startFakeSmtp()
    const { app } = await makeTestApp({ mailbox: fake })
    const admin = await makeCaller({ roles: ['admin'] })
    const resident = await makeCaller({ roles: ['resident'] })

    const asAdmin = await request(app).get('/api/mailbox').set('Authorization', admin.auth)
    const asResident = await request(app).get('/api/mailbox').set('Authorization', resident.auth)

    expect(asAdmin.status).toBe(200)
    expect(asAdmin.body).toEqual({ messages: [] })
    expect(asResident.status).toBe(403)
  })

  it('when no catcher runs (a real relay is configured), does not exist', async () => {
    const { app } = await makeTestApp()
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await request(app).get('/api/mailbox').set('Authorization', admin.auth)

    expect(res.status).toBe(404)
  })
})

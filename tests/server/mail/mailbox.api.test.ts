import request from 'supertest'
import { afterEach, describe, expect, it } from 'vitest'
import { startFakeSmtp, type FakeSmtp } from '../../../server/mail/fake-smtp.ts'
import { OutboxSchema } from '#shared/schemas/mail'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { cleanupList, deadPort, mailerOn, makeMessage } from './outbox-harness.ts'

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

describe('GET /api/mailbox/outbox', () => {
  const cleanups = cleanupList()
  afterEach(() => cleanups.run())

  /** The demo app with a mailer on the same database: one message delivered, one given up after two attempts. */
  async function outboxWithHistory() {
    fake = await startFakeSmtp()
    const { app, sequelize } = await makeTestApp({ mailbox: fake })
    const good = mailerOn(cleanups, sequelize, fake.port)
    await good.enqueue(makeMessage({ to: ['attending@example.test'], subject: 'Delivered', text: 'https://x.test/#token=secret' }))
    await good.idle()
    good.close()
    const bad = mailerOn(cleanups, sequelize, await deadPort(), { retryDelaysMs: [0], maxAttempts: 2 })
    await bad.enqueue(makeMessage({ to: ['gone@example.test'], subject: 'Given up' }))
    await bad.idle()
    return app
  }

  it('shows an admin each message with its status, attempts and last error, and the counts, but never a body', async () => {
    const app = await outboxWithHistory()
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await request(app).get('/api/mailbox/outbox').set('Authorization', admin.auth)

    const outbox = OutboxSchema.parse(res.body)
    expect(res.status).toBe(200)
    expect(outbox.counts).toEqual({ queued: 0, sent: 1, failed: 1 })
    expect(outbox.messages.find((m) => m.subject === 'Delivered')).toMatchObject({ status: 'sent', attempts: 1, lastError: null })
    expect(outbox.messages.find((m) => m.subject === 'Given up')).toMatchObject({ status: 'failed', attempts: 2, recipient: 'gone@example.test' })
    expect(outbox.messages.find((m) => m.subject === 'Given up')!.lastError).toMatch(/ECONNREFUSED/)
    expect(JSON.stringify(res.body)).not.toContain('token=secret')
  })

  it('filters by status', async () => {
    const app = await outboxWithHistory()
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await request(app).get('/api/mailbox/outbox').query({ status: 'failed' }).set('Authorization', admin.auth)

    expect(res.body.messages.map((m: { subject: string }) => m.subject)).toEqual(['Given up'])
  })

  it('when the status is not one of queued, sent or failed, responds 400 naming the field', async () => {
    fake = await startFakeSmtp()
    const { app } = await makeTestApp({ mailbox: fake })
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await request(app).get('/api/mailbox/outbox').query({ status: 'lost' }).set('Authorization', admin.auth)

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('status')
  })

  it('refuses anyone but an admin', async () => {
    fake = await startFakeSmtp()
    const { app } = await makeTestApp({ mailbox: fake })
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await request(app).get('/api/mailbox/outbox').set('Authorization', educator.auth)

    expect(res.status).toBe(403)
  })
})

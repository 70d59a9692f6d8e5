import { describe, expect, it } from 'vitest'
import express from 'express'
import request from 'supertest'
import type { CapturedMessage } from '../../../server/mail/fake-smtp.ts'
import { mailboxRouter } from '../../../server/mail/mailbox.routes.ts'
import { MailboxSchema } from '#shared/schemas/mail'

function makeCaptured(overrides: Partial<CapturedMessage> = {}): CapturedMessage {
  return {
    to: ['attending@example.test'],
    from: 'Plumbline <no-reply@plumbline.test>',
    subject: 'A subject',
    text: 'A body',
    receivedAt: '2026-12-03T09:00:00.000Z',
    ...overrides,
  }
}

function appWith(messages: CapturedMessage[]) {
  return express().use('/api/mailbox', mailboxRouter({ messages: () => messages }))
}

describe('GET /api/mailbox', () => {
  it('lists the caught messages newest first, with recipients, subject, text and arrival time', async () => {
    const older = makeCaptured({ subject: 'Older', receivedAt: '2026-12-03T09:00:00.000Z' })
    const newer = makeCaptured({ subject: 'Newer', receivedAt: '2026-12-03T09:05:00.000Z' })

    const res = await request(appWith([older, newer])).get('/api/mailbox')

    expect(res.status).toBe(200)
    expect(MailboxSchema.parse(res.body).messages.map((m) => m.subject)).toEqual(['Newer', 'Older'])
    expect(res.body.messages[0]).toEqual({ to: newer.to, subject: 'Newer', text: 'A body', receivedAt: newer.receivedAt })
  })

  it('when nothing has arrived, responds with an empty list', async () => {
    const app = appWith([])

    const res = await request(app).get('/api/mailbox')

    expect(res.status).toBe(200)
    expect(res.body).toEqual({ messages: [] })
  })
})

import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import type { Sequelize } from 'sequelize'
import { countersignRequested } from '../../../server/mail/templates.ts'
import { openTestDatabase } from '../helpers.ts'
import { captureLog } from './capture-log.ts'
import { cleanupList, deadPort, fakeSmtp, mailerOn, makeMessage, outboxRows } from './outbox-harness.ts'

const cleanups = cleanupList()
let db: Sequelize

beforeEach(async () => {
  db = await openTestDatabase()
})
afterEach(() => cleanups.run())

describe('mailer', () => {
  it('delivers a message over SMTP to each recipient, with sender, subject and text', async () => {
    const fake = await fakeSmtp(cleanups)
    const mailer = mailerOn(cleanups, db, fake.port)

    mailer.send(makeMessage({ to: ['one@example.test', 'two@example.test'] }))
    await mailer.idle()

    const received = fake.messages()
    expect(received.map((m) => m.to).sort()).toEqual([['one@example.test'], ['two@example.test']])
    expect(received.every((m) => m.subject === 'An exam waits' && m.from.includes('no-reply@plumbline.test'))).toBe(true)
    expect(received[0]!.text.trim()).toBe('Please review it.')
  })

  it('delivers a template message intact, long lines and non-ASCII characters included', async () => {
    const fake = await fakeSmtp(cleanups)
    const mailer = mailerOn(cleanups, db, fake.port)
    const message = countersignRequested({
      baseUrl: 'https://plumbline.example.org',
      to: ['attending@example.test'],
      residentName: 'Dr Zoë Okafor',
      exam: { id: 'exam-1', examinedAt: '2026-12-03T09:30:00Z', teamName: 'Cardiology – Ward 7' },
    })

    await mailer.enqueue(message)
    await mailer.idle()

    expect(fake.messages()[0]).toMatchObject({ to: message.to, subject: message.subject })
    expect(fake.messages()[0]!.text.trim()).toBe(message.text)
  })

  it('once sent, marks the message sent and keeps no body (it may hold a one-time link)', async () => {
    const fake = await fakeSmtp(cleanups)
    const mailer = mailerOn(cleanups, db, fake.port)

    await mailer.enqueue(makeMessage({ text: 'https://plumbline.test/invitation#token=secret' }))
    await mailer.idle()

    expect(await outboxRows(db)).toEqual([expect.objectContaining({ status: 'sent', attempts: 1, lastError: null, text: '' })])
  })

  it('when the SMTP server is down, keeps the message and delivers it once the server is back', async () => {
    const port = await deadPort()
    const { log, messages } = captureLog()
    const mailer = mailerOn(cleanups, db, port, { log, retryDelaysMs: [20, 50, 100] })

    const returned = mailer.send(makeMessage({ subject: 'Sent while the relay was down' }))
    const queuedWhenSendReturned = mailer.pending()
    await vi.waitFor(() => expect(messages()).toContain('not delivered; will retry'), { timeout: 10_000 })
    const back = await fakeSmtp(cleanups, port)
    await mailer.idle()

    expect(returned).toBeUndefined()
    expect(queuedWhenSendReturned).toBe(1)
    expect(back.messages().map((m) => m.subject)).toEqual(['Sent while the relay was down'])
    expect(mailer.pending()).toBe(0)
  })

  it('logs a failed delivery by template and message id, never by subject, text or address', async () => {
    const { log, lines } = captureLog()
    const mailer = mailerOn(cleanups, db, await deadPort(), { log, retryDelaysMs: [10], maxAttempts: 2 })

    mailer.send(makeMessage({ to: ['res@example.test'], subject: 'About MRN-4411', text: 'Patient MRN-4411' }))
    await mailer.idle()

    const failures = lines.filter((line) => line.level >= 40)
    expect(failures.length).toBeGreaterThan(0)
    expect(failures[0]).toMatchObject({ template: 'test-notice', attempt: 1, code: expect.any(String) })
    expect(JSON.stringify(lines)).not.toMatch(/MRN-4411|res@example\.test/)
  })

  it('retries a failing relay and, after the last allowed attempt, marks the message failed with the last error', async () => {
    const { log, messages } = captureLog()
    const mailer = mailerOn(cleanups, db, await deadPort(), { log, retryDelaysMs: [10], maxAttempts: 3 })

    mailer.send(makeMessage())
    await mailer.idle()

    expect(mailer.pending()).toBe(0)
    expect(messages().filter((m) => m === 'not delivered; will retry')).toHaveLength(2)
    expect(messages().filter((m) => m === 'given up')).toHaveLength(1)
    const [row] = await outboxRows(db)
    expect(row).toMatchObject({ status: 'failed', attempts: 3, text: '' })
    expect(row!.lastError).toContain('ECONNREFUSED')
  })

  it('ignores a message with no recipients, such as a team with no attendings', async () => {
    const fake = await fakeSmtp(cleanups)
    const mailer = mailerOn(cleanups, db, fake.port)

    mailer.send(makeMessage({ to: [] }))
    await mailer.idle()

    expect(mailer.pending()).toBe(0)
    expect(fake.messages()).toEqual([])
    expect(await outboxRows(db)).toEqual([])
  })
})

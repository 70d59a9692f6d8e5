import { afterEach, describe, expect, it, vi } from 'vitest'
import { pino } from 'pino'
import { startFakeSmtp } from '../../../server/mail/fake-smtp.ts'
import { createMailer, type MailerOptions, type MailMessage } from '../../../server/mail/mailer.ts'
import { countersignRequested } from '../../../server/mail/templates.ts'
import { captureLog } from './capture-log.ts'

const FROM = 'Plumbline <no-reply@plumbline.test>'
const cleanups: (() => unknown)[] = []

afterEach(async () => {
  for (const cleanup of cleanups.splice(0).reverse()) await cleanup()
})

async function fakeSmtp(port?: number) {
  const fake = await startFakeSmtp({ port })
  cleanups.push(() => fake.close())
  return fake
}

function mailerOn(port: number, options: Partial<MailerOptions> = {}) {
  const mailer = createMailer({ host: '127.0.0.1', port, from: FROM, log: pino({ level: 'silent' }), ...options })
  cleanups.push(() => mailer.close())
  return mailer
}

/** A loopback port where, a moment ago, an SMTP server listened and now nothing does. */
async function deadPort(): Promise<number> {
  const fake = await startFakeSmtp()
  await fake.close()
  return fake.port
}

function makeMessage(overrides: Partial<MailMessage> = {}): MailMessage {
  return { template: 'test-notice', to: ['attending@example.test'], subject: 'An exam waits', text: 'Please review it.', ...overrides }
}

describe('mailer', () => {
  it('delivers a message over SMTP with its recipients, sender, subject and text', async () => {
    const fake = await fakeSmtp()
    const mailer = mailerOn(fake.port)

    mailer.send(makeMessage({ to: ['one@example.test', 'two@example.test'] }))
    await mailer.idle()

    const [received] = fake.messages()
    expect(fake.messages()).toHaveLength(1)
    expect(received).toMatchObject({ to: ['one@example.test', 'two@example.test'], subject: 'An exam waits' })
    expect(received!.from).toContain('no-reply@plumbline.test')
    expect(received!.text.trim()).toBe('Please review it.')
  })

  it('delivers a template message intact, long lines and non-ASCII characters included', async () => {
    const fake = await fakeSmtp()
    const mailer = mailerOn(fake.port)
    const message = countersignRequested({
      baseUrl: 'https://plumbline.example.org',
      to: ['attending@example.test'],
      residentName: 'Dr Zoë Okafor',
      exam: { id: 'exam-1', examinedAt: '2026-12-03T09:30:00Z', teamName: 'Cardiology – Ward 7' },
    })

    mailer.send(message)
    await mailer.idle()

    expect(fake.messages()[0]).toMatchObject({ to: message.to, subject: message.subject })
    expect(fake.messages()[0]!.text.trim()).toBe(message.text)
  })

  it('when the SMTP server is down, keeps the message and delivers it once the server is back', async () => {
    const port = await deadPort()
    const { log, messages } = captureLog()
    const mailer = mailerOn(port, { log, retryDelaysMs: [20, 50, 100] })

    const returned = mailer.send(makeMessage({ subject: 'Sent while the relay was down' }))
    const queuedWhenSendReturned = mailer.pending()
    await vi.waitFor(() => expect(messages()).toContain('not delivered; will retry'), { timeout: 10_000 })
    const back = await fakeSmtp(port)
    await mailer.idle()

    expect(returned).toBeUndefined()
    expect(queuedWhenSendReturned).toBe(1)
    expect(back.messages().map((m) => m.subject)).toEqual(['Sent while the relay was down'])
    expect(mailer.pending()).toBe(0)
  })

  it('logs a failed delivery by template and recipient count, never by subject, text or address', async () => {
    const { log, lines } = captureLog()
    const mailer = mailerOn(await deadPort(), { log, retryDelaysMs: [10], maxAttempts: 2 })
    const message = makeMessage({ to: ['res@example.test'], subject: 'About MRN-4411', text: 'Patient MRN-4411' })

    mailer.send(message)
    await mailer.idle()

    const failures = lines.filter((line) => line.level >= 40)
    expect(failures.length).toBeGreaterThan(0)
    expect(failures[0]).toMatchObject({ template: 'test-notice', recipients: 1 })
    expect(JSON.stringify(lines)).not.toMatch(/MRN-4411|res@example\.test/)
  })

  it('after the last allowed attempt, gives the message up and says so in the log', async () => {
    const { log, messages } = captureLog()
    const mailer = mailerOn(await deadPort(), { log, retryDelaysMs: [10], maxAttempts: 3 })

    mailer.send(makeMessage())
    await mailer.idle()

    expect(mailer.pending()).toBe(0)
    expect(messages().filter((m) => m === 'not delivered; will retry')).toHaveLength(2)
    expect(messages().filter((m) => m === 'given up')).toHaveLength(1)
  })

  it('ignores a message with no recipients, such as a team with no attendings', async () => {
    const fake = await fakeSmtp()
    const mailer = mailerOn(fake.port)

    mailer.send(makeMessage({ to: [] }))
    await mailer.idle()

    expect(mailer.pending()).toBe(0)
    expect(fake.messages()).toEqual([])
  })
})

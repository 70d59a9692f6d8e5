import { pino } from 'pino'
import request from 'supertest'
import { afterEach, expect } from 'vitest'
import { afterResponseIdle } from '../../../server/accounts/background.ts'
import { startFakeSmtp, type CapturedMessage, type FakeSmtp } from '../../../server/mail/fake-smtp.ts'
import { createMailer, type Mailer } from '../../../server/mail/mailer.ts'
import { makeTestApp } from '../helpers.ts'

export const BASE_URL = 'https://plumbline.example.org'
/** Passes every rule: 27 characters, no e-mail part, not on the list. */
export const NEW_PASSWORD = 'tide tables for the old pier'

const cleanups: (() => unknown)[] = []

afterEach(async () => {
  await afterResponseIdle()
  for (const cleanup of cleanups.splice(0).reverse()) await cleanup()
})

/** The app sending real SMTP to a fake server, as the demo does. */
export async function appWithMail(overrides: Parameters<typeof makeTestApp>[0] = {}) {
  const fake: FakeSmtp = await startFakeSmtp()
  cleanups.push(() => fake.close())
  const mailer: Mailer = createMailer({ host: '127.0.0.1', port: fake.port, from: 't@x', log: pino({ level: 'silent' }), retryDelaysMs: [20], maxAttempts: 50 })
  cleanups.push(() => mailer.close())
  const { app } = await makeTestApp({ mailer, baseUrl: BASE_URL, ...overrides })
  /** Everything queued has been delivered (or given up), including work done after a response. */
  const delivered = async (): Promise<CapturedMessage[]> => {
    await afterResponseIdle()
    await mailer.idle()
    return fake.messages()
  }
  return { app, fake, mailer, delivered }
}

/** The token carried in a message's link fragment (`#token=`). */
export function tokenIn(message: CapturedMessage | undefined): string {
  const match = /#token=([^\s]+)/.exec(message?.text ?? '')
  expect(match, 'the message holds a link with a token').not.toBeNull()
  return decodeURIComponent(match![1]!)
}

export function setPassword(app: Parameters<typeof request>[0], token: string, password = NEW_PASSWORD) {
  return request(app).post('/api/auth/set-password').send({ token, password })
}

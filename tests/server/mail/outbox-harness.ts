import { pino, type Logger } from 'pino'
import { QueryTypes, type Sequelize } from 'sequelize'
import { startFakeSmtp, type FakeSmtp } from '../../../server/mail/fake-smtp.ts'
import { createMailer, type MailerOptions, type MailMessage } from '../../../server/mail/mailer.ts'

export const FROM = 'Plumbline <no-reply@plumbline.test>'

/** Runs the registered cleanups, newest first; call it from afterEach. */
export function cleanupList() {
  const cleanups: (() => unknown)[] = []
  return {
    add: (cleanup: () => unknown) => void cleanups.push(cleanup),
    run: async () => {
      for (const cleanup of cleanups.splice(0).reverse()) await cleanup()
    },
  }
}

export type Cleanups = ReturnType<typeof cleanupList>

export async function fakeSmtp(cleanups: Cleanups, port?: number): Promise<FakeSmtp> {
  const fake = await startFakeSmtp({ port })
  cleanups.add(() => fake.close())
  return fake
}

/** A loopback port where, a moment ago, an SMTP server listened and now nothing does. */
export async function deadPort(): Promise<number> {
  const fake = await startFakeSmtp()
  await fake.close()
  return fake.port
}

export function mailerOn(cleanups: Cleanups, sequelize: Sequelize, port: number, options: Partial<MailerOptions> = {}) {
  const log: Logger = options.log ?? pino({ level: 'silent' })
  const mailer = createMailer({ host: '127.0.0.1', port, from: FROM, log, sequelize, ...options })
  cleanups.add(() => mailer.close())
  return mailer
}

export function makeMessage(overrides: Partial<MailMessage> = {}): MailMessage {
  return { template: 'test-notice', to: ['attending@example.test'], subject: 'An exam waits', text: 'Please review it.', ...overrides }
}

export interface StoredOutboxRow {
  recipient: string
  status: string
  attempts: number
  lastError: string | null
  text: string
}

export function outboxRows(sequelize: Sequelize): Promise<StoredOutboxRow[]> {
  return sequelize.query<StoredOutboxRow>(
    `SELECT "recipient", "status", "attempts", "lastError", "text" FROM "mail_outbox" ORDER BY "createdAt", "recipient"`,
    { type: QueryTypes.SELECT },
  )
}

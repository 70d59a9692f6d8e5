import nodemailer from 'nodemailer'
import type { Logger } from 'pino'
import { RetryQueue, type RetryPolicy } from './retry-queue.ts'

export interface MailMessage {
  /** Names the template in logs, which never carry the subject or the body. */
  template: string
  to: string[]
  subject: string
  text: string
}

/** How workflow and account e-mails leave: passed down from the app's dependencies to every sender. */
export interface MailDeps {
  /** Absent in API tests that send nothing. */
  mailer?: Mailer
  /** Where users reach the app (PUBLIC_URL); links in e-mails are built on it, never on a request's Host header. */
  baseUrl: string
}

export interface MailerOptions extends Partial<RetryPolicy> {
  host: string
  port: number
  from: string
  log: Logger
  /** For a production relay that wants a login; the demo's fake takes none. */
  auth?: { user: string; pass: string }
}

export interface Mailer {
  /** Queues the message and returns at once; delivery, retries and failures are the mailer's business. */
  send(message: MailMessage): void
  /** Resolves once nothing waits to be delivered (or the mailer is closed): for tests and shutdown. */
  idle(): Promise<void>
  pending(): number
  close(): void
}

const RETRY_DELAYS_MS = [1_000, 5_000, 30_000, 120_000, 600_000]
const MAX_ATTEMPTS = 20

function isPermanent(err: unknown): boolean {
  // A 5xx reply (e.g. a refused address) will be the same next time.
  const { responseCode } = (err ?? {}) as { responseCode?: unknown }
  return typeof responseCode === 'number' && responseCode >= 500
}

/** An SMTP sender behind an in-memory retry queue: a dead relay never delays or fails the clinical action. */
export function createMailer(options: MailerOptions): Mailer {
  const { host, port, from, log, auth } = options
  // Short timeouts: a relay that does not answer fails this attempt fast, and the queue tries again later.
  const timeouts = { connectionTimeout: 5_000, greetingTimeout: 5_000, socketTimeout: 15_000 }
  const transport = nodemailer.createTransport({ host, port, secure: port === 465, auth, ...timeouts })
  const queue = new RetryQueue<MailMessage>({
    deliver: async ({ to, subject, text }) => void (await transport.sendMail({ from, to, subject, text })),
    describe: ({ template, to }) => ({ template, recipients: to.length }),
    isPermanent,
    log: log.child({ component: 'mailer' }),
    retryDelaysMs: options.retryDelaysMs ?? RETRY_DELAYS_MS,
    maxAttempts: options.maxAttempts ?? MAX_ATTEMPTS,
  })
  return {
    send: (message) => (message.to.length > 0 ? queue.add(message) : undefined),
    idle: () => queue.idle(),
    pending: () => queue.size,
    close: () => {
      queue.close()
      transport.close()
    },
  }
}

import nodemailer from 'nodemailer'
import type { Logger } from 'pino'
import type { Sequelize, Transaction } from 'sequelize'
import { UserModel } from '../models/index.ts'
import { insertMessage } from './outbox-store.ts'
import { OutboxWorker, type RetryPolicy } from './outbox-worker.ts'

export interface MailMessage {
  /** Names the template in logs, which never carry the subject or the body. */
  template: string
  to: string[]
  subject: string
  text: string
  html?: string
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
  /** The database holding the outbox; by default the one the models are bound to (initModels). */
  sequelize?: Sequelize
  pollMs?: number
}

export interface Mailer {
  /**
   * Stores the message in the outbox, one row per recipient: inside `transaction` when given, so it leaves only after
   * that commits and never when it rolls back; else at once. Delivery, retries and failures are the outbox's business.
   */
  enqueue(message: MailMessage, options?: { transaction?: Transaction }): Promise<void>
  /** `enqueue` without waiting and without a transaction; a failure to store is logged. */
  send(message: MailMessage): void
  /** Resolves once nothing waits to be delivered (or the mailer is closed): for tests and shutdown. */
  idle(): Promise<void>
  /** Messages waiting, as this server last counted them. */
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

/**
 * An SMTP sender behind the durable outbox (`mail_outbox`): a dead relay never delays or fails the clinical action, and
 * a restart loses nothing. On creation it sends whatever is already due.
 */
export function createMailer(options: MailerOptions): Mailer {
  const { host, port, from, log, auth } = options
  const db = () => options.sequelize ?? UserModel.sequelize
  // Short timeouts: a relay that does not answer fails this attempt fast, and the outbox tries again later.
  const timeouts = { connectionTimeout: 5_000, greetingTimeout: 5_000, socketTimeout: 15_000 }
  const transport = nodemailer.createTransport({ host, port, secure: port === 465, auth, ...timeouts })
  const worker = new OutboxWorker({
    db,
    deliver: async ({ recipient, subject, text, html }) =>
      void (await transport.sendMail({ from, to: recipient, subject, text, html: html ?? undefined })),
    isPermanent,
    log: log.child({ component: 'mailer' }),
    retryDelaysMs: options.retryDelaysMs ?? RETRY_DELAYS_MS,
    maxAttempts: options.maxAttempts ?? MAX_ATTEMPTS,
    pollMs: options.pollMs ?? 60_000,
    staleAfterMs: 5 * 60_000,
  })
  const storing = new Set<Promise<void>>()
  const enqueue: Mailer['enqueue'] = async (message, { transaction } = {}) => {
    const count = await insertMessage(db()!, message, transaction)
    if (!count) return
    if (transaction) transaction.afterCommit(() => worker.added(count))
    else worker.added(count)
  }
  worker.kick()
  return {
    enqueue,
    send: (message) => {
      const task = enqueue(message)
        .catch((err: unknown) => log.error({ template: message.template, error: (err as Error)?.name }, 'e-mail not queued'))
        .finally(() => storing.delete(task))
      storing.add(task)
    },
    idle: async () => {
      while (storing.size) await Promise.allSettled([...storing])
      await worker.idle()
    },
    pending: () => storing.size + worker.queued,
    close: () => {
      worker.close()
      transport.close()
    },
  }
}

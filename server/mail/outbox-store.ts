import { randomUUID } from 'node:crypto'
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'
import type { MailMessage } from './mailer.ts'

// Plain SQL that SQLite and PostgreSQL both read. Every state change is one conditional UPDATE: a row is claimed only
// while queued and unclaimed, and settled only by the worker holding the claim, so two servers never send one row.

/** A claimed message, as the worker needs it to send. */
export interface OutboxRow {
  id: string
  template: string
  recipient: string
  subject: string
  text: string
  html: string | null
  attempts: number
}

const select = <T extends object>(db: Sequelize, sql: string, replacements: Record<string, unknown> = {}) =>
  db.query<T>(sql, { type: QueryTypes.SELECT, replacements })

async function changed(db: Sequelize, sql: string, replacements: Record<string, unknown>): Promise<number> {
  const [, count] = (await db.query(sql, { type: QueryTypes.UPDATE, replacements })) as [unknown, number]
  return count
}

/** One queued row per recipient, in `transaction` when given; returns how many were written. */
export async function insertMessage(db: Sequelize, message: MailMessage, transaction?: Transaction): Promise<number> {
  const now = new Date()
  const rows = [...new Set(message.to)].map((recipient) => ({
    id: randomUUID(),
    template: message.template,
    recipient,
    subject: message.subject,
    text: message.text,
    html: message.html ?? null,
    status: 'queued',
    attempts: 0,
    nextAttemptAt: now,
    createdAt: now,
  }))
  if (rows.length) await db.getQueryInterface().bulkInsert('mail_outbox', rows, { transaction })
  return rows.length
}

export function dueMessages(db: Sequelize, now: Date, limit: number): Promise<OutboxRow[]> {
  return select<OutboxRow>(
    db,
    `SELECT "id", "template", "recipient", "subject", "text", "html", "attempts" FROM "mail_outbox"
     WHERE "status" = 'queued' AND "claimedBy" IS NULL AND "nextAttemptAt" <= :now ORDER BY "nextAttemptAt", "createdAt" LIMIT ${limit}`,
    { now },
  )
}

/** Takes the row for `worker` and counts the attempt; false when another worker (or server) was first. */
export async function claim(db: Sequelize, id: string, worker: string, now: Date): Promise<boolean> {
  const sql = `UPDATE "mail_outbox" SET "claimedBy" = :worker, "claimedAt" = :now, "attempts" = "attempts" + 1
     WHERE "id" = :id AND "status" = 'queued' AND "claimedBy" IS NULL`
  return (await changed(db, sql, { id, worker, now })) === 1
}

export async function markSent(db: Sequelize, id: string, worker: string, now: Date): Promise<void> {
  const sql = `UPDATE "mail_outbox" SET "status" = 'sent', "sentAt" = :now, "nextAttemptAt" = NULL, "claimedBy" = NULL,
     "claimedAt" = NULL, "text" = '', "html" = NULL WHERE "id" = :id AND "claimedBy" = :worker`
  await changed(db, sql, { id, worker, now })
}

// The error's codes and the relay's reply line: enough for an admin to act on, never the message itself.
function errorText(err: unknown): string {
  const { code, responseCode, response, message } = (err ?? {}) as Record<string, unknown>
  return [code, responseCode, response ?? message].filter((part) => part !== undefined && part !== '').join(' ')
}

/** Releases the row for another attempt at `retryAt`, or, when `retryAt` is null, gives it up as failed. */
export async function markFailed(db: Sequelize, id: string, worker: string, err: unknown, retryAt: Date | null): Promise<void> {
  const settle = retryAt ? `"nextAttemptAt" = :retryAt` : `"status" = 'failed', "nextAttemptAt" = NULL, "text" = '', "html" = NULL`
  const sql = `UPDATE "mail_outbox" SET ${settle}, "lastError" = :lastError, "claimedBy" = NULL, "claimedAt" = NULL
     WHERE "id" = :id AND "claimedBy" = :worker`
  await changed(db, sql, { id, worker, lastError: errorText(err).slice(0, 300), retryAt })
}

/** Frees claims older than `before`: their server stopped mid-attempt, and the message is tried again. */
export async function releaseStale(db: Sequelize, before: Date): Promise<void> {
  const sql = `UPDATE "mail_outbox" SET "claimedBy" = NULL, "claimedAt" = NULL WHERE "status" = 'queued' AND "claimedAt" < :before`
  await changed(db, sql, { before })
}

/** How many messages wait unclaimed (a claimed one is its worker's business), and when the earliest is due. */
export async function queueState(db: Sequelize): Promise<{ queued: number; nextDueAt: Date | null }> {
  const [row] = await select<{ queued: number | string; next: string | Date | null }>(
    db,
    `SELECT COUNT(*) AS "queued", MIN("nextAttemptAt") AS "next" FROM "mail_outbox" WHERE "status" = 'queued' AND "claimedBy" IS NULL`,
  )
  return { queued: Number(row?.queued ?? 0), nextDueAt: row?.next ? new Date(row.next) : null }
}

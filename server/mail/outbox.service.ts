import { QueryTypes, type Sequelize } from 'sequelize'
import { OutboxSchema, type Outbox, type OutboxQuery, type OutboxStatus } from '#shared/schemas/mail'
import { UserModel } from '../models/index.ts'

type StoredMessage = Record<'id' | 'template' | 'recipient' | 'subject' | 'status', string> & {
  attempts: number
  lastError: string | null
} & Record<'nextAttemptAt' | 'createdAt' | 'sentAt', string | Date | null>

const iso = (value: string | Date | null) => (value === null ? null : new Date(value).toISOString())

async function countsOf(db: Sequelize): Promise<Record<OutboxStatus, number>> {
  const rows = await db.query<{ status: OutboxStatus; n: number | string }>(
    `SELECT "status", COUNT(*) AS "n" FROM "mail_outbox" GROUP BY "status"`,
    { type: QueryTypes.SELECT },
  )
  const counts = { queued: 0, sent: 0, failed: 0 }
  for (const { status, n } of rows) counts[status] = Number(n)
  return counts
}

/** The outbox for an admin, newest first, without the bodies: a body may hold a one-time link. */
export async function listOutbox(query: OutboxQuery, db: Sequelize = UserModel.sequelize!): Promise<Outbox> {
  const rows = await db.query<StoredMessage>(
    `SELECT "id", "template", "recipient", "subject", "status", "attempts", "nextAttemptAt", "lastError", "createdAt", "sentAt"
     FROM "mail_outbox" ${query.status ? `WHERE "status" = :status` : ''} ORDER BY "createdAt" DESC, "id" LIMIT ${query.limit}`,
    { type: QueryTypes.SELECT, replacements: { status: query.status ?? null } },
  )
  const messages = rows.map((r) => ({ ...r, nextAttemptAt: iso(r.nextAttemptAt), createdAt: iso(r.createdAt)!, sentAt: iso(r.sentAt) }))
  return OutboxSchema.parse({ messages, counts: await countsOf(db) })
}

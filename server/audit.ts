import { QueryTypes, UniqueConstraintError, type Sequelize, type Transaction } from 'sequelize'
import { GENESIS_HASH, linkRows } from './audit-trail/audit-chain.ts'
import { holdWriteOrder } from './db/write-locks.ts'
import { AuditEventModel } from './models/index.ts'

export interface AuditEntry {
  actorId: string | null
  action: string
  entityType?: string
  entityId?: string
  changes?: Record<string, unknown>
}

// Two writers outside a transaction may read the same head; the unique sequence refuses the second, which reads again.
const ATTEMPTS = 5

async function headOf(db: Sequelize, transaction?: Transaction): Promise<{ seq: number; hash: string }> {
  const [head] = await db.query<{ seq: number; hash: string }>(
    `SELECT "seq", "hash" FROM "audit_events" WHERE "seq" IS NOT NULL ORDER BY "seq" DESC LIMIT 1`,
    { type: QueryTypes.SELECT, transaction },
  )
  return head ?? { seq: 0, hash: GENESIS_HASH }
}

function rowOf(entry: AuditEntry, at: Date) {
  return {
    at,
    actorId: entry.actorId,
    action: entry.action,
    entityType: entry.entityType ?? null,
    entityId: entry.entityId ?? null,
    changes: entry.changes ? JSON.stringify(entry.changes) : null,
  }
}

/** The events chained after the head and inserted in one statement; the head's writers are kept out (holdWriteOrder). */
async function appendLocked(db: Sequelize, entries: AuditEntry[], transaction: Transaction): Promise<void> {
  await holdWriteOrder(db, transaction)
  const rows = linkRows(
    entries.map((entry) => rowOf(entry, new Date())),
    await headOf(db, transaction),
  )
  await db.getQueryInterface().bulkInsert('audit_events', rows, { transaction })
}

/**
 * Appends the events in one statement, each chained to the one before (server/audit-trail/audit-chain.ts). The head is
 * read in the caller's transaction, whose write lock (writeTransaction) keeps any other writer from appending between
 * the read and the insert. PostgreSQL has no such lock: the append takes the write-order lock (db/write-locks.ts)
 * before it reads the head, in the caller's transaction or in one of its own.
 */
async function append(entries: AuditEntry[], transaction?: Transaction): Promise<void> {
  if (entries.length === 0) return
  const db = AuditEventModel.sequelize!
  if (db.getDialect() !== 'sqlite') {
    return transaction ? appendLocked(db, entries, transaction) : db.transaction((own) => appendLocked(db, entries, own))
  }
  for (let attempt = 1; ; attempt += 1) {
    try {
      const at = new Date()
      const rows = linkRows(
        entries.map((entry) => rowOf(entry, at)),
        await headOf(db, transaction),
      )
      return void (await db.getQueryInterface().bulkInsert('audit_events', rows, { transaction }))
    } catch (err) {
      if (transaction || !(err instanceof UniqueConstraintError) || attempt >= ATTEMPTS) throw err
    }
  }
}

/** Appends one event to the trail, stamped with the server's clock. */
export async function audit(entry: AuditEntry, options: { transaction?: Transaction } = {}): Promise<void> {
  await append([entry], options.transaction)
}

/** Appends several events in one statement, e.g. the creations of one sync push. */
export async function auditAll(entries: AuditEntry[], options: { transaction?: Transaction } = {}): Promise<void> {
  await append(entries, options.transaction)
}

import type { Transaction } from 'sequelize'
import { AuditEventModel } from './models/index.ts'

export interface AuditEntry {
  actorId: string | null
  action: string
  entityType?: string
  entityId?: string
  changes?: Record<string, unknown>
}

/** Appends one event to the trail, stamped with the server's clock. */
export async function audit(entry: AuditEntry, options: { transaction?: Transaction } = {}): Promise<void> {
  await AuditEventModel.create(
    {
      at: new Date(),
      actorId: entry.actorId,
      action: entry.action,
      entityType: entry.entityType ?? null,
      entityId: entry.entityId ?? null,
      changes: entry.changes ? JSON.stringify(entry.changes) : null,
    },
    options,
  )
}

/** Appends several events in one statement, e.g. the creations of one sync push. */
export async function auditAll(entries: AuditEntry[], options: { transaction?: Transaction } = {}): Promise<void> {
  const at = new Date()
  const rows = entries.map((entry) => ({
    at,
    actorId: entry.actorId,
    action: entry.action,
    entityType: entry.entityType ?? null,
    entityId: entry.entityId ?? null,
    changes: entry.changes ? JSON.stringify(entry.changes) : null,
  }))
  await AuditEventModel.bulkCreate(rows, options)
}

import { AuditEventModel } from './models/index.ts'

export interface AuditEntry {
  actorId: string | null
  action: string
  entityType?: string
  entityId?: string
  changes?: Record<string, unknown>
}

/** Appends one event to the trail, stamped with the server's clock. */
export async function audit(entry: AuditEntry): Promise<void> {
  await AuditEventModel.create({
    at: new Date(),
    actorId: entry.actorId,
    action: entry.action,
    entityType: entry.entityType ?? null,
    entityId: entry.entityId ?? null,
    changes: entry.changes ? JSON.stringify(entry.changes) : null,
  })
}

import { Op } from 'sequelize'
import { AuditEventSchema, type AuditEvent } from '#shared/schemas/audit'
import { maskCodes } from '../exams/code-masking.ts'
import { UserModel, type AuditEventModel } from '../models/index.ts'

/** Stored events in the API's shape, with the actor's current name joined. */
export async function presentEvents(rows: AuditEventModel[]): Promise<AuditEvent[]> {
  const actorIds = [...new Set(rows.flatMap((r) => (r.actorId ? [r.actorId] : [])))]
  const actors = await UserModel.findAll({ where: { id: { [Op.in]: actorIds } } })
  const names = new Map(actors.map((u) => [u.id, u.displayName]))
  return rows.map((r) =>
    AuditEventSchema.parse({
      id: r.id,
      at: r.at.toISOString(),
      actorId: r.actorId,
      actorName: (r.actorId && names.get(r.actorId)) ?? null,
      action: r.action,
      entityType: r.entityType,
      entityId: r.entityId,
      changes: r.changes ? JSON.parse(r.changes) : null,
    }),
  )
}

/**
 * The patient codes an event's before/after names: in its `patientCode` field (exams) and in a `patientCodes` list
 * (e.g. `round-create`, whose `to` lists the round's codes).
 */
function codesIn(event: AuditEvent): string[] {
  const single = event.changes?.patientCode as { from?: unknown; to?: unknown } | undefined
  const lists = event.changes?.patientCodes as { from?: unknown; to?: unknown } | undefined
  const values = [single?.from, single?.to, ...[lists?.from, lists?.to].flatMap((v) => (Array.isArray(v) ? v : [v]))]
  return values.filter((c): c is string => typeof c === 'string')
}

/** Replaces every known patient code in the events' before/after (fields and free text) with its pseudonym. */
export function maskEvents(events: AuditEvent[], knownCodes: string[], mask: (code: string) => string): AuditEvent[] {
  const codes = [...knownCodes, ...events.flatMap(codesIn)]
  return events.map((e) => ({ ...e, changes: maskCodes(e.changes, codes, mask) }))
}

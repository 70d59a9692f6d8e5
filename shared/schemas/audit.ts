import { z } from 'zod'
import { clientTime, idField, lineField } from './fields.ts'

const isoDateTime = clientTime('Use an ISO 8601 date-time')

/** One entry of the append-only trail; `changes` holds `{ field: { from, to } }` for changed fields, or other details. */
export const AuditEventSchema = z.object({
  id: z.number().int(),
  at: z.string(),
  actorId: z.string().nullable(),
  actorName: z.string().nullable(),
  action: z.string(),
  entityType: z.string().nullable(),
  entityId: z.string().nullable(),
  changes: z.record(z.string(), z.unknown()).nullable(),
})
export type AuditEvent = z.infer<typeof AuditEventSchema>

export const AuditQuerySchema = z.object({
  actorId: idField('Choose a person').optional(),
  action: lineField(60).optional(),
  entityType: lineField(40).optional(),
  entityId: idField('Give a record id').optional(),
  from: isoDateTime.optional(),
  to: isoDateTime.optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
})
export type AuditQuery = z.infer<typeof AuditQuerySchema>

/** Newest first. */
export const AuditPageSchema = z.object({
  events: z.array(AuditEventSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
})
export type AuditPage = z.infer<typeof AuditPageSchema>

/** One exam's events, oldest first. */
export const ExamHistorySchema = z.object({ events: z.array(AuditEventSchema) })
export type ExamHistory = z.infer<typeof ExamHistorySchema>

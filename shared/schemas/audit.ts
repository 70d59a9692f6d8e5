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

/**
 * The first thing wrong in the chain, walked in sequence order: `missing-row` (the sequence skips `seq`), `bad-link`
 * (row `seq` does not point at the hash of the row before), `changed-row` (row `seq` no longer gives its own hash),
 * `unchained-row` (a row with no place in the chain, written around the server).
 */
export const AuditChainBreakSchema = z.object({
  kind: z.enum(['missing-row', 'bad-link', 'changed-row', 'unchained-row']),
  /** The sequence number where the chain breaks; null for an unchained row. */
  seq: z.number().int().nullable(),
  /** The time of the row at the break (for a missing row, of the row after the gap), as stored. */
  at: z.string().nullable(),
  message: z.string(),
})
export type AuditChainBreak = z.infer<typeof AuditChainBreakSchema>

/** `GET /api/audit/verify` and `npm run audit:verify`. */
export const AuditChainReportSchema = z.object({
  ok: z.boolean(),
  /** Rows walked before the first break, or all of them. */
  checkedRows: z.number().int(),
  /** The last row of the chain: record it elsewhere, since rows cut from the end leave no gap to see. */
  head: z.object({ seq: z.number().int(), hash: z.string(), at: z.string() }).nullable(),
  firstBreak: AuditChainBreakSchema.nullable(),
  verifiedAt: z.iso.datetime(),
})
export type AuditChainReport = z.infer<typeof AuditChainReportSchema>

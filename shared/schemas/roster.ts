import { z } from 'zod'
import { RoleSchema } from './user.ts'

/** Limits of a roster upload (see DEVELOPERS.md, "Roster import"). */
export const ROSTER_MAX_BYTES = 1024 * 1024
export const ROSTER_MAX_ROWS = 2000

export const RosterRowStatusSchema = z.enum(['new', 'changed', 'unchanged', 'invalid'])
export type RosterRowStatus = z.infer<typeof RosterRowStatusSchema>

/** The fields a row's reasons are keyed by; `row` is about the line as a whole (e.g. a wrong number of fields). */
export const RosterFieldSchema = z.enum(['email', 'displayName', 'roles', 'team', 'row'])
export type RosterField = z.infer<typeof RosterFieldSchema>

const change = <T extends z.ZodType>(value: T) => z.object({ from: value, to: value })

/** What applying the row changes on an existing account. */
export const RosterChangesSchema = z.object({
  displayName: change(z.string()).optional(),
  roles: change(z.array(RoleSchema)).optional(),
  teams: change(z.array(z.string())).optional(),
})
export type RosterChanges = z.infer<typeof RosterChangesSchema>

/** One data row of the file, as read (trimmed), with what importing it would do. */
export const RosterRowSchema = z.object({
  /** Line of the file where the row starts; the header is line 1. */
  line: z.number().int().positive(),
  email: z.string(),
  displayName: z.string(),
  roles: z.array(z.string()),
  teams: z.array(z.string()),
  status: RosterRowStatusSchema,
  /** For `invalid`: one message per field that needs attention. */
  reasons: z.partialRecord(RosterFieldSchema, z.string()).optional(),
  /** For `changed`: before and after of each changed field. */
  changes: RosterChangesSchema.optional(),
  /** Things worth knowing that do not stop the row, e.g. a deactivated account stays deactivated. */
  notes: z.array(z.string()).optional(),
})
export type RosterRow = z.infer<typeof RosterRowSchema>

export const RosterCountsSchema = z.object({
  new: z.number().int(),
  changed: z.number().int(),
  unchanged: z.number().int(),
  invalid: z.number().int(),
})
export type RosterCounts = z.infer<typeof RosterCountsSchema>

/** `POST /api/admin/roster/preview`. */
export const RosterPreviewSchema = z.object({
  rows: z.array(RosterRowSchema),
  counts: RosterCountsSchema,
  /** Header cells that name no known column; their values are not read. */
  ignoredColumns: z.array(z.string()),
})
export type RosterPreview = z.infer<typeof RosterPreviewSchema>

/**
 * `POST /api/admin/roster/apply`: the rows as they were when applied (invalid rows were skipped), and what was written.
 * Each created account was sent an invitation.
 */
export const RosterApplyResultSchema = RosterPreviewSchema.extend({
  created: z.number().int(),
  updated: z.number().int(),
  skipped: z.number().int(),
})
export type RosterApplyResult = z.infer<typeof RosterApplyResultSchema>

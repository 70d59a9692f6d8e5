import { VenousSignsSchema } from '#shared/schemas/exam'
import type { ExamModel } from '../models/index.ts'
import { storedInput } from './exam-columns.ts'

type Snapshot = Record<string, unknown>

export interface FieldChange {
  from: unknown
  to: unknown
}

/** What the audit trail records of an exam: every record field, the workflow state, the computed CVP and any return comment. */
export function snapshotOf(row: ExamModel): Snapshot {
  const { id: _id, ...fields } = storedInput(row)
  // The older list of present signs and the same signs as states are one content, not a change.
  const signs = VenousSignsSchema.safeParse(fields.venousSigns)
  return {
    ...fields,
    venousSigns: signs.success ? signs.data : fields.venousSigns,
    // Always present here, even at their defaults, so that a change back to a default is a change.
    venousConfirmed: row.venousConfirmed ?? false,
    notAssessableReason: row.notAssessableReason ?? null,
    notAssessableText: row.notAssessableText ?? null,
    context: JSON.parse(row.context ?? '[]'),
    status: row.status,
    version: row.version,
    submittedAt: row.submittedAt?.toISOString() ?? null,
    cvpCmH2O: row.cvpCmH2O,
    returnComment: row.returnComment ?? null,
  }
}

/** Field-by-field before/after (21 CFR 11.10(e)); `before` is null for a new record. */
export function changesBetween(before: Snapshot | null, after: Snapshot): Record<string, FieldChange> {
  const changes: Record<string, FieldChange> = {}
  for (const [field, to] of Object.entries(after)) {
    const from = before ? before[field] : null
    if (JSON.stringify(from) !== JSON.stringify(to)) changes[field] = { from: from ?? null, to: to ?? null }
  }
  return changes
}

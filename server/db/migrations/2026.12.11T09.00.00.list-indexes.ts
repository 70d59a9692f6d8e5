import type { QueryInterface } from 'sequelize'
import { quoteName } from '../quote.ts'

// Exams without an estimate sort as the lowest height and CVP; the same expression is in server/exams/exam-keyset.ts,
// and an index serves an ORDER BY only when the two match.
const lowestIfNull = (column: string) => `COALESCE(${quoteName(column)}, -1e308)`

/**
 * Composite indexes for the paged reads. Each ends in the sort key and `id`, the tie-breaker of keyset paging, so a
 * page is one range of one index in either direction: no sort of the reader's rows and no OFFSET walk.
 */
const INDEXES: [name: string, keys: string[]][] = [
  // A resident's log (and CSV export, and a log filtered by examiner), under each sort the log offers.
  ['exams_examiner_examined_at', ['examinerId', 'examinedAt', 'id']],
  ['exams_examiner_updated_at', ['examinerId', 'updatedAt', 'id']],
  ['exams_examiner_status', ['examinerId', 'status', 'id']],
  ['exams_examiner_patient_code', ['examinerId', 'patientCode', 'id']],
  ['exams_examiner_height', ['examinerId', lowestIfNull('verticalHeightCm'), 'id']],
  ['exams_examiner_cvp', ['examinerId', lowestIfNull('cvpCmH2O'), 'id']],
  // An attending's or educator's log over many examiners: read in sort order, filtered by their scope.
  ['exams_examined_at', ['examinedAt', 'id']],
  ['exams_updated_at_id', ['updatedAt', 'id']],
  ['exams_status_id', ['status', 'id']],
  ['exams_patient_code_id', ['patientCode', 'id']],
  ['exams_height_id', [lowestIfNull('verticalHeightCm'), 'id']],
  ['exams_cvp_id', [lowestIfNull('cvpCmH2O'), 'id']],
  // The log filtered by status (e.g. submitted), and by team and status.
  ['exams_status_examined_at', ['status', 'examinedAt', 'id']],
  ['exams_team_status_examined_at', ['teamId', 'status', 'examinedAt', 'id']],
  // The sign-off queue: submitted exams of a team, the longest-waiting first; with the examiner, so the queue's count
  // and its "not one's own" filter are read from the index alone.
  ['exams_status_team_submitted_at', ['status', 'teamId', 'submittedAt', 'id', 'examinerId']],
  // The sync pull of one examiner's exams in change order.
  ['exams_examiner_sync_seq', ['examinerId', 'syncSeq']],
]

const key = (k: string) => (k.startsWith('COALESCE') ? k : quoteName(k))

export async function up(q: QueryInterface): Promise<void> {
  for (const [name, keys] of INDEXES) await q.sequelize.query(`CREATE INDEX ${quoteName(name)} ON exams (${keys.map(key).join(', ')})`)
}

export async function down(q: QueryInterface): Promise<void> {
  for (const [name] of [...INDEXES].reverse()) await q.sequelize.query(`DROP INDEX ${quoteName(name)}`)
}

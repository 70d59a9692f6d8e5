import type { QueryInterface } from 'sequelize'
import { byDatabase } from '../dialect.ts'

const MEASURED = `status != 'draft' AND columnTop = 'seen' AND verticalHeightCm IS NOT NULL AND cvpCmH2O IS NOT NULL`
const PACKED = `concat_ws(char(31), patientCode, CAST(round(unixepoch(examinedAt, 'subsec') * 1000) AS INTEGER), verticalHeightCm, cvpCmH2O)`

export async function up(q: QueryInterface): Promise<void> {
  // Covers the agreement query of server/agreement/pair-source.ts: measured non-drafts in patient-code and time
  // order, with the text each contributes precomputed, so building 100,000 pairs neither reads the wide exam rows
  // nor formats their numbers again.
  // SQLite only (unixepoch, char): 2026.12.08T09.00.00.agreement-pairs-table replaced its one reader with a table and
  // drops it, so a PostgreSQL database, which never ran that reader, never gets it.
  const packed = `CREATE INDEX exams_agreement_pairs ON exams (patientCode, examinedAt, examinerId, teamId, ${PACKED}) WHERE ${MEASURED}`
  for (const sql of byDatabase(q, { sqlite: [packed], postgres: [] })) await q.sequelize.query(sql)
  // Finds the patients whose exams changed since the pairs were last built, so only they are paired again.
  await q.addIndex('exams', ['updatedAt', 'patientCode'], { name: 'exams_updated_at_patient_code' })
}

export async function down(q: QueryInterface): Promise<void> {
  await q.removeIndex('exams', 'exams_updated_at_patient_code')
  await q.sequelize.query('DROP INDEX IF EXISTS exams_agreement_pairs')
}

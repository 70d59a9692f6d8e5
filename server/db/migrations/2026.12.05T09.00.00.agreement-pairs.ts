import type { QueryInterface } from 'sequelize'

const MEASURED = `status != 'draft' AND columnTop = 'seen' AND verticalHeightCm IS NOT NULL AND cvpCmH2O IS NOT NULL`
const PACKED = `concat_ws(char(31), patientCode, CAST(round(unixepoch(examinedAt, 'subsec') * 1000) AS INTEGER), verticalHeightCm, cvpCmH2O)`

export async function up(q: QueryInterface): Promise<void> {
  // Covers the agreement query of server/agreement/pair-source.ts: measured non-drafts in patient-code and time
  // order, with the text each contributes precomputed, so building 100,000 pairs neither reads the wide exam rows
  // nor formats their numbers again.
  await q.sequelize.query(`CREATE INDEX exams_agreement_pairs ON exams (patientCode, examinedAt, examinerId, teamId, ${PACKED}) WHERE ${MEASURED}`)
  // Finds the patients whose exams changed since the pairs were last built, so only they are paired again.
  await q.addIndex('exams', ['updatedAt', 'patientCode'], { name: 'exams_updated_at_patient_code' })
}

export async function down(q: QueryInterface): Promise<void> {
  await q.removeIndex('exams', 'exams_updated_at_patient_code')
  await q.sequelize.query('DROP INDEX exams_agreement_pairs')
}

import { DataTypes, type QueryInterface } from 'sequelize'
import { dropColumn } from '../columns.ts'
import { appendOnlyTriggers, dropSyncCursorTriggers, syncCursorTriggers } from '../triggers.ts'

const TABLE = 'reference_measurements'
const SIGNATURE_COLUMNS = ['readingExamId', 'feedback', 'feedbackText'] as const
const BAND_COLUMNS = ['bandLowCmH2O', 'bandHighCmH2O'] as const
// Every column the accuracy summary reads of an exam: SQLite then answers from the index and never reads the wide row
// (its estimate JSON spills into overflow pages).
const ACCURACY_INDEX = { name: 'exams_accuracy', fields: ['examinedAt', 'id', 'status', 'teamId', 'cvpCmH2O', ...BAND_COLUMNS] }

/** The stored band's ends as columns, from each exam's estimate; the sync cursor does not move, as no record changes. */
async function addBandColumns(q: QueryInterface): Promise<void> {
  for (const column of BAND_COLUMNS) await q.addColumn('exams', column, { type: DataTypes.DOUBLE, allowNull: true })
  await dropSyncCursorTriggers(q)
  await q.sequelize.transaction(async (transaction) => {
    const options = { attributes: ['id', 'estimate'], transaction }
    const rows = (await q.select(null, 'exams', options)) as { id: string; estimate: string }[]
    for (const { id, estimate } of rows) {
      const band = (JSON.parse(estimate) as { bandCmH2O?: [number | null, number | null] | null }).bandCmH2O
      if (band) await q.bulkUpdate('exams', { bandLowCmH2O: band[0], bandHighCmH2O: band[1] }, { id }, { transaction })
    }
  })
  await syncCursorTriggers(q)
  await q.addIndex('exams', ACCURACY_INDEX.fields, { name: ACCURACY_INDEX.name })
}

/**
 * Measured pressures beside an exam (central line, catheter, echocardiographic estimate), and with a countersignature
 * the attending's own reading (a link to their exam) and teaching feedback; neither is part of the signed content. The
 * exams' stored band as two columns, so the accuracy summary need not parse every estimate.
 */
export async function up(q: QueryInterface): Promise<void> {
  const ref = (model: string) => ({ type: DataTypes.STRING(36), allowNull: false, references: { model, key: 'id' }, onDelete: 'RESTRICT' })
  await q.createTable(TABLE, {
    id: { type: DataTypes.STRING(36), primaryKey: true },
    examId: ref('exams'),
    kind: { type: DataTypes.STRING(20), allowNull: false },
    value: { type: DataTypes.DOUBLE, allowNull: false },
    unit: { type: DataTypes.STRING(10), allowNull: false },
    valueCmH2O: { type: DataTypes.DOUBLE, allowNull: false },
    measuredAt: { type: DataTypes.DATE, allowNull: false },
    addedById: ref('users'),
    addedAt: { type: DataTypes.DATE, allowNull: false },
  })
  // Covers what the accuracy summary reads of a reference, found by its exam: the table itself is never read.
  await q.addIndex(TABLE, ['examId', 'measuredAt', 'kind', 'valueCmH2O', 'id'], { name: 'reference_measurements_exam_id' })
  // A measured value is evidence: corrections are new rows, never edits.
  await appendOnlyTriggers(q, TABLE, 'reference measurements are append-only')
  await q.addColumn('signatures', 'readingExamId', {
    type: DataTypes.STRING(36),
    allowNull: true,
    references: { model: 'exams', key: 'id' },
    onDelete: 'RESTRICT',
  })
  await q.addColumn('signatures', 'feedback', { type: DataTypes.TEXT, allowNull: true })
  await q.addColumn('signatures', 'feedbackText', { type: DataTypes.TEXT, allowNull: true })
  await q.addIndex('signatures', ['readingExamId'], { name: 'signatures_reading_exam_id' })
  await addBandColumns(q)
}

export async function down(q: QueryInterface): Promise<void> {
  await q.removeIndex('exams', ACCURACY_INDEX.name)
  for (const column of [...BAND_COLUMNS].reverse()) await dropColumn(q, 'exams', column)
  await q.removeIndex('signatures', 'signatures_reading_exam_id')
  for (const column of [...SIGNATURE_COLUMNS].reverse()) await dropColumn(q, 'signatures', column)
  await q.dropTable(TABLE)
}

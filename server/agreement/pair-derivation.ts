import { Op, type QueryInterface, type Sequelize, type Transaction, type WhereOptions } from 'sequelize'
import { readingsWhere, windowIn } from './pair-readings.ts'
import { rowOf } from './pair-rows.ts'
import { pairReadings, type ExamPair } from './pairs.ts'

/** The connection and the write transaction the pairs are derived in, so they commit or roll back with the write. */
export interface PairWrite {
  sequelize: Sequelize
  transaction: Transaction
}

const TABLE = 'agreement_pairs'
const CODES_PER_QUERY = 500
const ROWS_PER_INSERT = 500

async function insertPairs({ sequelize, transaction }: PairWrite, pairs: ExamPair[]): Promise<void> {
  const rows = pairs.map(rowOf)
  for (let i = 0; i < rows.length; i += ROWS_PER_INSERT)
    await sequelize.getQueryInterface().bulkInsert(TABLE, rows.slice(i, i + ROWS_PER_INSERT), { transaction })
}

async function deleteWhere({ sequelize, transaction }: PairWrite, where: WhereOptions): Promise<void> {
  await sequelize.getQueryInterface().bulkDelete(TABLE, where, { transaction })
}

/**
 * Which exams pair: `with-bounds` (today's rule: seen, above the neck and not filled) or `seen-only`, the rule of the
 * table before bounds paired, for the migrations that write that table (its heights are NOT NULL).
 */
export type PairingRule = 'with-bounds' | 'seen-only'
const READINGS_OF: Record<PairingRule, WhereOptions> = { 'with-bounds': {}, 'seen-only': { columnTop: 'seen' } }

/**
 * Writes the pairs of these patient codes again from their exams as they stand in the write's transaction. Called by
 * every write that can change which exams pair (save, submit, return, amend, sync push, round close); a code that
 * left an exam (a changed patient code) is named too.
 */
export async function derivePairs(
  patientCodes: Iterable<string>,
  write: PairWrite,
  rule: PairingRule = 'with-bounds',
): Promise<void> {
  const codes = [...new Set(patientCodes)]
  if (!codes.length) return
  const windowMinutes = await windowIn(write)
  for (let i = 0; i < codes.length; i += CODES_PER_QUERY) {
    const chunk = { patientCode: { [Op.in]: codes.slice(i, i + CODES_PER_QUERY) } }
    await deleteWhere(write, chunk)
    await insertPairs(write, pairReadings(await readingsWhere(write, { ...READINGS_OF[rule], ...chunk }), windowMinutes))
  }
}

/**
 * Whether the table can hold a bound's pair: the table of migration 2026.12.08T09.00.00.agreement-pairs-table has a
 * height on both sides (NOT NULL), so its up, and the down of 2026.12.10T09.30.00.agreement-pair-bounds, derive only
 * the pairs of two seen column tops, the rule of that schema. Asked only here: a change of the window is rare.
 */
async function holdsBounds({ sequelize, transaction }: PairWrite): Promise<boolean> {
  // The options reach the query (and so the transaction's connection), though the typings do not name `transaction`.
  const options = { transaction } as Parameters<QueryInterface['describeTable']>[1]
  const columns = await sequelize.getQueryInterface().describeTable(TABLE, options)
  return columns.earlierHeightCm?.allowNull === true
}

const keyOf = (earlierExamId: string, laterExamId: string) => `${earlierExamId}/${laterExamId}`

/**
 * Every patient code's pairs again, e.g. with a new pairing window saved in the same transaction (else the stored one).
 * A pair of the same two exams stays as stored: every write to an exam derives its patient's pairs again, so the row is
 * current; only the pairs that end or begin are written, which keeps a change of window quick on a large table.
 */
export async function deriveAllPairs(write: PairWrite, windowMinutes?: number): Promise<void> {
  const only = READINGS_OF[(await holdsBounds(write)) ? 'with-bounds' : 'seen-only']
  const derived = pairReadings(await readingsWhere(write, only), windowMinutes ?? (await windowIn(write)))
  const options = { attributes: ['earlierExamId', 'laterExamId'], transaction: write.transaction }
  const stored = (await write.sequelize.getQueryInterface().select(null, TABLE, options)) as { earlierExamId: string; laterExamId: string }[]
  const derivedKeys = new Set(derived.map((p) => keyOf(p.earlier.examId, p.later.examId)))
  const storedKeys = new Set(stored.map((r) => keyOf(r.earlierExamId, r.laterExamId)))
  const ended = stored.filter((r) => !derivedKeys.has(keyOf(r.earlierExamId, r.laterExamId))).map((r) => r.earlierExamId)
  for (let i = 0; i < ended.length; i += ROWS_PER_INSERT)
    await deleteWhere(write, { earlierExamId: { [Op.in]: ended.slice(i, i + ROWS_PER_INSERT) } })
  await insertPairs(write, derived.filter((p) => !storedKeys.has(keyOf(p.earlier.examId, p.later.examId))))
}

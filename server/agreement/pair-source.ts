import { Op, QueryTypes } from 'sequelize'
import { VeinSchema, type Vein } from '#shared/schemas/exam'
import { ExamModel } from '../models/index.ts'
import { PackedScanner } from './packed-scanner.ts'
import type { Reading } from './pairs.ts'

const millis = `CAST(round(unixepoch(e.examinedAt, 'subsec') * 1000) AS INTEGER)`
// Calibration-round entries never pair (server/rounds): the round has its own results, and pairing them would show
// blinded readings before the round closes. Their rowids come from the small partial index exams_round_id.
const NOT_ROUND = `e.rowid NOT IN (SELECT rowid FROM exams WHERE roundId IS NOT NULL)`
const MEASURED = `e.status != 'draft' AND e.columnTop = 'seen' AND e.verticalHeightCm IS NOT NULL AND e.cvpCmH2O IS NOT NULL AND ${NOT_ROUND}`
// The same expression as migration 2026.12.05T09.00.00.agreement-pairs indexes, so SQLite reads it from the index.
const INDEXED = `concat_ws(char(31), e.patientCode, ${millis}, e.verticalHeightCm, e.cvpCmH2O)`
// Inclination and vein come from the table row, not the index: reading them costs the first build a lookup per exam.
const RECORD = `concat_ws(char(31), ${INDEXED}, e.vein, e.inclinationDeg, e.rowid, u.rowid, t.rowid)`
const ORDER = 'e.patientCode, e.examinedAt'
const FROM = 'FROM exams e JOIN users u ON u.id = e.examinerId JOIN teams t ON t.id = e.teamId'

// One packed string rather than a JS object per row: the driver spends most of its time building row objects.
// Examiners and teams travel as their small rowids. The fast form reads the index in order; SQLite does not promise
// that group_concat keeps that order, so the rows are checked and, if it was lost, read again sorted in the aggregate.
export const QUERIES = {
  fast: (where = MEASURED) => `SELECT group_concat(r, char(30)) AS packed
    FROM (SELECT ${RECORD} AS r ${FROM} WHERE ${where} ORDER BY ${ORDER})`,
  sorted: (where = MEASURED) => `SELECT group_concat(${RECORD}, char(30) ORDER BY ${ORDER}) AS packed ${FROM} WHERE ${where}`,
}

async function idsByRowid(table: 'users' | 'teams'): Promise<string[]> {
  const rows = await ExamModel.sequelize!.query<{ rowid: number; id: string }>(`SELECT rowid AS rowid, id FROM ${table}`, { type: QueryTypes.SELECT })
  const ids: string[] = []
  for (const { rowid, id } of rows) ids[rowid] = id
  return ids
}

// One string per vein rather than a slice of the packed text each, which would keep that text alive with the pairs.
const VEINS = new Map(VeinSchema.options.map((v) => [v, v]))
const interned = (vein: string): string => VEINS.get(vein as Vein) ?? vein

/** The readings with an ordinal per patient code; null when the codes are out of order. */
function unpack(packed: string, examinerIds: string[], teamIds: string[]): Reading[] | null {
  const scan = new PackedScanner(packed)
  const readings: Reading[] = []
  let patient = -1
  let patientCode = ''
  while (!scan.done) {
    const next = scan.text()
    if (next < patientCode) return null
    if (next !== patientCode || patient < 0) {
      patient += 1
      patientCode = next
    }
    const at = scan.number()
    const heightCm = scan.number()
    const cvpCmH2O = scan.number()
    const vein = interned(scan.text())
    const inclinationDeg = scan.number()
    const rowid = scan.number()
    const examinerId = examinerIds[scan.number()]!
    const teamId = teamIds[scan.number()]!
    readings.push({ patient, patientCode, rowid, examinerId, teamId, at, heightCm, cvpCmH2O, inclinationDeg, vein })
  }
  return readings
}

async function packed(form: keyof typeof QUERIES, patientCodes?: readonly string[]): Promise<string> {
  const sql = QUERIES[form](patientCodes ? `${MEASURED} AND e.patientCode IN (:patientCodes)` : MEASURED)
  const [row] = await ExamModel.sequelize!.query<{ packed: string | null }>(sql, { type: QueryTypes.SELECT, replacements: { patientCodes } })
  return row?.packed ?? ''
}

/**
 * Every measured, non-draft exam (of the given patients only, if named), grouped by patient code, in one query;
 * pairReadings orders each patient's by time.
 */
export async function loadReadings(patientCodes?: readonly string[]): Promise<Reading[]> {
  if (patientCodes?.length === 0) return []
  const [examinerIds, teamIds, fast] = await Promise.all([idsByRowid('users'), idsByRowid('teams'), packed('fast', patientCodes)])
  return unpack(fast, examinerIds, teamIds) ?? unpack(await packed('sorted', patientCodes), examinerIds, teamIds)!
}

/** How many measured, non-draft exams there are: every one of them is a reading. */
export async function countReadings(): Promise<number> {
  const [row] = await ExamModel.sequelize!.query<{ n: number }>(`SELECT count(*) AS n FROM exams e WHERE ${MEASURED}`, { type: QueryTypes.SELECT })
  return row?.n ?? 0
}

/** The patient codes of exams written since `since`, drafts included: their patients may have gained or lost a pair. */
export async function changedPatientCodes(since: Date): Promise<string[]> {
  // No GROUP BY: it would lead SQLite to walk every exam in patient-code order instead of the recent few by updatedAt.
  const rows = await ExamModel.findAll({ attributes: ['patientCode'], where: { updatedAt: { [Op.gte]: since } }, raw: true })
  return [...new Set(rows.map((r) => r.patientCode))]
}

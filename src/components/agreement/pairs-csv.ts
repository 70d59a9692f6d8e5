import Papa from 'papaparse'
import { FORMULA_START } from '#shared/domain/csv-safety'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import type { AgreementPair, PairReading } from '#shared/schemas/agreement'

const READING_COLUMNS = ['exam_id', 'examiner', 'role', 'team', 'examined_at', 'height_cm', 'inclination_deg', 'vein', 'category', 'elevated'] as const

/**
 * The columns of the pairs CSV, one row per pair (documented in DEVELOPERS.md, "Agreement dashboard"):
 * `patient_code` (masked for educators, as on screen), `difference_order` (`resident-minus-attending` or
 * `earlier-minus-later`), `difference_cm` (first − second height above the sternal angle), `mean_cm`, `minutes_apart`,
 * then for the `first_` and `second_` reading of the difference: exam id, examiner's name, role, team, time (ISO 8601,
 * UTC), height (cm), trunk inclination (°), vein, CVP category (low/normal/high) and elevated (h > 3 cm, McGee 1998's threshold and the default setting, by which agreement judges both readings alike: true/false).
 */
export const PAIR_CSV_COLUMNS = [
  'patient_code',
  'difference_order',
  'difference_cm',
  'mean_cm',
  'minutes_apart',
  ...READING_COLUMNS.map((c) => `first_${c}`),
  ...READING_COLUMNS.map((c) => `second_${c}`),
]

/** The last row: the caution in the first column, the rest empty, so a spreadsheet shows it under the data. */
export const CSV_CAUTION = `Caution: ${CAUTION_TEXT}`

const round = (value: number, dp: number) => Number(value.toFixed(dp))

function readingCells(r: PairReading, teamName: (id: string) => string) {
  return [r.examId, r.examinerName, r.role, teamName(r.teamId), r.examinedAt, r.heightCm, r.inclinationDeg, r.vein, r.category, r.elevated]
}

/**
 * The pairs as CSV (RFC 4180: header row, CRLF, quotes where needed) with papaparse's `unparse`; cells that a spreadsheet
 * would run as a formula are prefixed with an apostrophe. The caution closes the file as its own row.
 */
export function pairsCsv(pairs: readonly AgreementPair[], teamName: (id: string) => string = (id) => id): string {
  const rows = pairs.map((p) => [
    p.patientCode,
    p.order,
    round(p.differenceCm, 2),
    round(p.meanCm, 2),
    round(p.minutesApart, 1),
    ...readingCells(p.first, teamName),
    ...readingCells(p.second, teamName),
  ])
  const caution = [CSV_CAUTION, ...new Array<string>(PAIR_CSV_COLUMNS.length - 1).fill('')]
  return Papa.unparse({ fields: PAIR_CSV_COLUMNS, data: [...rows, caution] }, { escapeFormulae: FORMULA_START, newline: '\r\n' })
}

/** Saves text as a file through a temporary link; a byte-order mark lets spreadsheets read the UTF-8 names right. */
export function downloadCsv(filename: string, csv: string): void {
  const url = URL.createObjectURL(new Blob(['\ufeff', csv], { type: 'text/csv;charset=utf-8' }))
  const link = document.createElement('a')
  link.href = url
  link.download = filename
  document.body.append(link)
  link.click()
  link.remove()
  setTimeout(() => URL.revokeObjectURL(url), 0)
}

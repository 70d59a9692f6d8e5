import Papa from 'papaparse'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { signatureText } from '#shared/domain/signature-text'
import type { Exam } from '#shared/schemas/exam'
import { currentSignature } from './fhir-bundle.ts'
import { FORMULA_START } from '#shared/domain/csv-safety'

type Cell = string | number | boolean | null

/** Two decimals: finer than any bedside reading, and free of binary noise. Numbers stay numbers, so "." is the decimal. */
const round2 = (value: number | null | undefined) => (value === null || value === undefined ? null : Math.round(value * 100) / 100)

/** The columns of the CSV export, in order; documented in README.md, "CSV columns". */
export const CSV_COLUMNS: readonly [name: string, value: (exam: Exam, masked: boolean) => Cell][] = [
  ['exam_id', (x) => x.id],
  ['patient_code', (x) => x.patientCode],
  ['patient_code_masked', (_x, masked) => masked],
  ['team', (x) => x.teamName],
  ['examiner', (x) => x.examinerName],
  ['examined_at', (x) => new Date(x.examinedAt).toISOString()],
  ['status', (x) => x.status],
  ['version', (x) => x.version],
  ['inclination_deg', (x) => round2(x.inclinationDeg)],
  ['vein', (x) => x.vein],
  ['column_top', (x) => x.columnTop],
  ['height_method', (x) => x.heightMethod],
  ['reading_precision', (x) => x.readingPrecision],
  ['height_cm', (x) => round2(x.estimate.heightCm)],
  ['offset_model', (x) => x.estimate.offsetModel],
  ['offset_cm', (x) => round2(x.estimate.offsetCm)],
  ['bound', (x) => x.estimate.bound],
  ['cvp_cmh2o', (x) => round2(x.estimate.cvpCmH2O)],
  ['cvp_mmhg', (x) => round2(x.estimate.cvpMmHg)],
  ['band_low_cmh2o', (x) => round2(x.estimate.bandCmH2O?.[0])],
  ['band_high_cmh2o', (x) => round2(x.estimate.bandCmH2O?.[1])],
  ['band_low_mmhg', (x) => round2(x.estimate.bandMmHg?.[0])],
  ['band_high_mmhg', (x) => round2(x.estimate.bandMmHg?.[1])],
  ['sigma_cm', (x) => round2(x.estimate.sigmaCm)],
  ['observer_source', (x) => x.estimate.observerSource],
  ['elevated', (x) => x.estimate.elevated],
  ['category', (x) => x.estimate.category],
  ['confidence', (x) => x.estimate.confidence],
  ['countersigned_by', (x) => currentSignature(x)?.signerName ?? null],
  ['countersigned_at', (x) => currentSignature(x)?.signedAt ?? null],
  ['countersign_meaning', (x) => currentSignature(x)?.meaning ?? null],
  ['countersign_valid', (x) => currentSignature(x)?.valid ?? null],
  ['countersignature', (x) => (x.signatures ?? []).map(signatureText).join(' | ') || null],
  ['caution', () => CAUTION_TEXT],
]

/** The rows as CSV text: a header row, CRLF line ends (RFC 4180), UTF-8 with a byte-order mark for spreadsheets. */
export function examsCsv(rows: { exam: Exam; masked: boolean }[]): string {
  const fields = CSV_COLUMNS.map(([name]) => name)
  const data = rows.map(({ exam, masked }) => CSV_COLUMNS.map(([, value]) => value(exam, masked)))
  return `\ufeff${Papa.unparse({ fields, data }, { escapeFormulae: FORMULA_START, newline: '\r\n' })}`
}

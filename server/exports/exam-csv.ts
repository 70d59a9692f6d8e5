import Papa from 'papaparse'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { signatureText } from '#shared/domain/signature-text'
import type { Exam } from '#shared/schemas/exam'
import type { EstimateStatements } from './exam-statements.ts'
import { currentSignature } from './fhir-bundle.ts'
import { FORMULA_START } from '#shared/domain/csv-safety'

type Cell = string | number | boolean | null

/** One exam as the export writes it: the reader's view, whether its code is masked, and its estimate in words. */
export interface CsvRow {
  exam: Exam
  masked: boolean
  statements: EstimateStatements
}

/** Two decimals: finer than any bedside reading, and free of binary noise. Numbers stay numbers, so "." is the decimal. */
const round2 = (value: number | null | undefined) => (value === null || value === undefined ? null : Math.round(value * 100) / 100)
const list = (values: readonly string[], separator: string) => values.join(separator) || null

/** The columns of the CSV export, in order; documented in README.md, "CSV columns". Estimated values say so in their name. */
export const CSV_COLUMNS: readonly [name: string, value: (row: CsvRow) => Cell][] = [
  ['exam_id', ({ exam }) => exam.id],
  ['patient_code', ({ exam }) => exam.patientCode],
  ['patient_code_masked', ({ masked }) => masked],
  ['team', ({ exam }) => exam.teamName],
  ['examiner', ({ exam }) => exam.examinerName],
  ['examined_at', ({ exam }) => new Date(exam.examinedAt).toISOString()],
  ['status', ({ exam }) => exam.status],
  ['version', ({ exam }) => exam.version],
  ['inclination_deg', ({ exam }) => round2(exam.inclinationDeg)],
  ['vein', ({ exam }) => exam.vein],
  ['column_top', ({ exam }) => exam.columnTop],
  ['not_assessable_reason', ({ exam }) => (exam.columnTop === 'not-assessable' ? (exam.notAssessableReason ?? null) : null)],
  ['height_method', ({ exam }) => exam.heightMethod],
  ['reading_precision', ({ exam }) => exam.readingPrecision],
  ['context', ({ exam }) => list(exam.context, ';')],
  ['venous_confirmed', ({ exam }) => exam.venousConfirmed],
  ['height_cm', ({ exam }) => round2(exam.estimate.heightCm)],
  ['offset_model', ({ exam }) => exam.estimate.offsetModel],
  ['offset_cm', ({ exam }) => round2(exam.estimate.offsetCm)],
  ['convention_diff_cm', ({ exam }) => round2(exam.estimate.conventionDiffCm)],
  ['bound', ({ exam }) => exam.estimate.bound],
  ['cvp_estimate_cmh2o', ({ exam }) => round2(exam.estimate.cvpCmH2O)],
  ['cvp_estimate_mmhg', ({ exam }) => round2(exam.estimate.cvpMmHg)],
  ['estimate_band_low_cmh2o', ({ exam }) => round2(exam.estimate.bandCmH2O?.[0])],
  ['estimate_band_high_cmh2o', ({ exam }) => round2(exam.estimate.bandCmH2O?.[1])],
  ['estimate_band_low_mmhg', ({ exam }) => round2(exam.estimate.bandMmHg?.[0])],
  ['estimate_band_high_mmhg', ({ exam }) => round2(exam.estimate.bandMmHg?.[1])],
  ['estimate_sigma_cm', ({ exam }) => round2(exam.estimate.sigmaCm)],
  ['observer_source', ({ exam }) => exam.estimate.observerSource],
  ['observer_sigma_cm', ({ exam }) => round2(exam.estimate.observerSigmaCm)],
  ['observer_n', ({ exam }) => exam.estimate.observerN],
  ['elevated', ({ exam }) => exam.estimate.elevated],
  ['elevated_statement', ({ statements }) => statements.elevated],
  ['estimated_categories', ({ exam }) => list(exam.estimate.categories, ';')],
  ['category_statement', ({ statements }) => statements.category],
  ['confidence', ({ exam }) => exam.estimate.confidence],
  ['arterial_evidence', ({ exam }) => exam.estimate.arterialEvidence],
  ['arterial_warning', ({ statements }) => statements.arterialWarning],
  ['frame_note', ({ statements }) => statements.frameNote],
  ['other_cautions', ({ statements }) => list(statements.otherCautions, ' | ')],
  ['reviewed_band_low_cmh2o', ({ exam }) => round2(exam.estimate.reviewed?.bandCmH2O?.[0])],
  ['reviewed_band_high_cmh2o', ({ exam }) => round2(exam.estimate.reviewed?.bandCmH2O?.[1])],
  ['rules_version', ({ exam }) => exam.estimate.rulesVersion],
  ['settings_version', ({ exam }) => exam.estimate.settingsVersion ?? 1],
  ['countersigned_by', ({ exam }) => currentSignature(exam)?.signerName ?? null],
  ['countersigned_at', ({ exam }) => currentSignature(exam)?.signedAt ?? null],
  ['countersign_meaning', ({ exam }) => currentSignature(exam)?.meaning ?? null],
  ['countersign_valid', ({ exam }) => currentSignature(exam)?.valid ?? null],
  ['countersignature', ({ exam }) => list((exam.signatures ?? []).map(signatureText), ' | ')],
  ['caution', () => CAUTION_TEXT],
]

/** The rows as CSV text: a header row, CRLF line ends (RFC 4180), UTF-8 with a byte-order mark for spreadsheets. */
export function examsCsv(rows: readonly CsvRow[]): string {
  const fields = CSV_COLUMNS.map(([name]) => name)
  const data = rows.map((row) => CSV_COLUMNS.map(([, value]) => value(row)))
  return `\ufeff${Papa.unparse({ fields, data }, { escapeFormulae: FORMULA_START, newline: '\r\n' })}`
}

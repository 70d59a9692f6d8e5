import { Op, type WhereOptions } from 'sequelize'
import type { ExamExportQuery } from '#shared/schemas/export'
import { audit } from '../audit.ts'
import { AppError } from '../errors.ts'
import { readable, scopeOf, type ExamScope } from '../exams/exam-access.ts'
import { readableRow, type Viewer } from '../exams/exam-queries.ts'
import { present } from '../exams/exam-record.ts'
import { ExamModel } from '../models/index.ts'
import { examsCsv } from './exam-csv.ts'
import { examBundle, observationStatus, type FhirBundle } from './fhir-bundle.ts'

/** Rows are turned into the API's exam shape this many at a time (names and signatures are joined per batch). */
const BATCH = 500

function codeFor(scope: ExamScope, viewer: Viewer) {
  return (row: ExamModel) => (scope.showsCode(row) ? row.patientCode : viewer.mask(row.patientCode))
}

/** One exam as a FHIR R4 Bundle, for anyone who may read it; 404 otherwise. Audited as `exam-export`. */
export async function examFhir(viewer: Viewer, id: string): Promise<FhirBundle> {
  const { row, scope } = await readableRow(viewer.user, id)
  const [exam] = await present([row], codeFor(scope, viewer))
  const masked = !scope.showsCode(row)
  const bundle = examBundle(exam!, { masked })
  await audit({
    actorId: viewer.user.id,
    action: 'exam-export',
    entityType: 'exam',
    entityId: row.id,
    changes: { format: 'fhir-r4', version: row.version, status: observationStatus(exam!), codeMasked: masked },
  })
  return bundle
}

const invalid = (field: string, message: string) => new AppError('invalid-input', 400, 'Some fields need attention', { [field]: message })

/** The exam log's visibility: a search by patient code stays within the rows the reader sees unmasked. */
function visibleWhere(scope: ExamScope, query: ExamExportQuery): WhereOptions<ExamModel> {
  if (query.patientCode) {
    if (!scope.clinical) throw invalid('patientCode', 'Patient codes are masked for your role; filter by team or examiner')
    return scope.clinical
  }
  const where = readable(scope)
  if (!where) throw new AppError('forbidden', 403, 'Your role does not allow reading exams')
  return where
}

function filtersOf(query: ExamExportQuery): WhereOptions<ExamModel>[] {
  if (query.from && query.to && new Date(query.from) > new Date(query.to)) throw invalid('to', 'The end of the range is before its start')
  return [
    query.status && { status: query.status },
    query.teamId && { teamId: query.teamId },
    query.examinerId && { examinerId: query.examinerId },
    query.patientCode && { patientCode: query.patientCode },
    query.from && { examinedAt: { [Op.gte]: new Date(query.from) } },
    query.to && { examinedAt: { [Op.lte]: new Date(query.to) } },
  ].filter((w) => !!w)
}

/**
 * The exams the reader may list, filtered as the log is, as CSV, oldest first: an educator's program with codes
 * masked; one's own exams and, for attendings, their teams' (§2). Audited as `exams-export` with the filter and the
 * row count before the file leaves.
 */
export async function examsCsvExport(viewer: Viewer, query: ExamExportQuery): Promise<{ csv: string; rows: number }> {
  const scope = await scopeOf(viewer.user)
  const rows = await ExamModel.findAll({
    where: { [Op.and]: [visibleWhere(scope, query), ...filtersOf(query)] },
    order: [
      ['examinedAt', 'ASC'],
      ['id', 'ASC'],
    ],
  })
  const presented = []
  for (let i = 0; i < rows.length; i += BATCH) {
    const batch = rows.slice(i, i + BATCH)
    const exams = await present(batch, codeFor(scope, viewer))
    presented.push(...exams.map((exam, j) => ({ exam, masked: !scope.showsCode(batch[j]!) })))
  }
  // The trail keeps a searched patient code only as its pseudonym: admins read the trail with codes masked (§2).
  const filter = Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== ''))
  if (query.patientCode) filter.patientCode = viewer.mask(query.patientCode)
  await audit({
    actorId: viewer.user.id,
    action: 'exams-export',
    entityType: 'export',
    changes: { format: 'csv', filter, rows: rows.length, masked: presented.filter((p) => p.masked).length },
  })
  return { csv: examsCsv(presented), rows: rows.length }
}

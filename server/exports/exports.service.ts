import type { Exam } from '#shared/schemas/exam'
import type { ExamExportQuery } from '#shared/schemas/export'
import { audit } from '../audit.ts'
import { scopeOf } from '../exams/exam-access.ts'
import { codeFor, logWhere, readableRow, type Viewer } from '../exams/exam-queries.ts'
import { present } from '../exams/exam-record.ts'
import { ExamModel } from '../models/index.ts'
import { examsCsv } from './exam-csv.ts'
import { statementsOf } from './exam-statements.ts'
import { estimateSettingsOf, versionOf } from './estimate-settings.ts'
import { examBundle, observationStatus, type FhirBundle } from './fhir-bundle.ts'

/** Rows are turned into the API's exam shape this many at a time (names and signatures are joined per batch). */
const BATCH = 500

/** One exam as a FHIR R4 Bundle, for anyone who may read it; 404 otherwise. Audited as `exam-export`. */
export async function examFhir(viewer: Viewer, id: string): Promise<FhirBundle> {
  const { row, scope } = await readableRow(viewer.user, id)
  const [exam] = await present([row], codeFor(scope, viewer))
  const masked = !scope.showsCode(row)
  const settings = await estimateSettingsOf([exam!])
  const bundle = examBundle(exam!, { masked, statements: statementsOf(exam!.estimate, settings.get(versionOf(exam!))) })
  await audit({
    actorId: viewer.user.id,
    action: 'exam-export',
    entityType: 'exam',
    entityId: row.id,
    changes: { format: 'fhir-r4', version: row.version, status: observationStatus(exam!), codeMasked: masked },
  })
  return bundle
}

/**
 * The exams the reader may list, filtered as the log is, as CSV, oldest first: an educator's program with codes
 * masked; one's own exams and, for attendings, their teams' (README, Roles). Audited as `exams-export` with the
 * filter and the row count before the file leaves.
 */
export async function examsCsvExport(viewer: Viewer, query: ExamExportQuery): Promise<{ csv: string; rows: number }> {
  const scope = await scopeOf(viewer.user)
  const rows = await ExamModel.findAll({
    where: logWhere(scope, query),
    order: [
      ['examinedAt', 'ASC'],
      ['id', 'ASC'],
    ],
  })
  const presented = []
  for (let i = 0; i < rows.length; i += BATCH) {
    const batch = rows.slice(i, i + BATCH)
    const exams = await present(batch, codeFor(scope, viewer))
    const settings = await estimateSettingsOf(exams)
    const statements = (exam: Exam) => statementsOf(exam.estimate, settings.get(versionOf(exam)))
    presented.push(...exams.map((exam, j) => ({ exam, masked: !scope.showsCode(batch[j]!), statements: statements(exam) })))
  }
  // The trail keeps a searched patient code only as its pseudonym: admins read the trail with codes masked.
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

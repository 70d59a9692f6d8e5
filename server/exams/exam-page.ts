import { Op } from 'sequelize'
import { StoredEstimateSchema, VenousSignsSchema, type Exam } from '#shared/schemas/exam'
import { TeamModel, UserModel, type ExamModel } from '../models/index.ts'
import { signaturesOf } from '../supervision/signatures.ts'
import { viewKey, type PageCache } from './exam-caches.ts'
import { storedInput } from './exam-columns.ts'

const isCurrentEstimate = (value: unknown) => (value as { rulesVersion?: unknown } | null)?.rulesVersion === 2
const isSignMap = (value: unknown) => !!value && typeof value === 'object' && !Array.isArray(value)

/**
 * The stored estimate as the API shows it: a current-rules one as saved (it was checked when it was computed and is
 * never recomputed); a first-rules one in today's shape.
 */
function estimateOf(row: ExamModel): Exam['estimate'] {
  const stored: unknown = JSON.parse(row.estimate)
  return isCurrentEstimate(stored) ? (stored as Exam['estimate']) : StoredEstimateSchema.parse(stored)
}

/**
 * The free text (notes, the "other" reason, a return comment) for a reader who sees the patient code: as written.
 * A reader who sees the code masked (an educator) gets none of it: free text can name any patient, not only this one.
 */
function freeTextFor(row: ExamModel, code: string) {
  if (code !== row.patientCode) return { notes: '', notAssessableText: null, returnComment: null }
  return { notes: row.notes ?? '', returnComment: row.returnComment ?? null }
}

function examOf(row: ExamModel, code: string, names: { examiner: string; team: string }, signatures: Exam['signatures']): Exam {
  const record = storedInput(row)
  return {
    ...record,
    venousSigns:
      isSignMap(record.venousSigns) && Object.keys(record.venousSigns as object).length === 7
        ? record.venousSigns
        : VenousSignsSchema.parse(record.venousSigns),
    venousConfirmed: row.venousConfirmed,
    context: [...new Set(JSON.parse(row.context ?? '[]') as string[])],
    patientCode: code,
    ...freeTextFor(row, code),
    examinerId: row.examinerId,
    examinerName: names.examiner,
    teamName: names.team,
    status: row.status,
    version: row.version,
    estimate: estimateOf(row),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    submittedAt: row.submittedAt?.toISOString() ?? null,
    signatures,
  } as Exam
}

/**
 * Rows in the API's exam shape, as `present` (exam-record.ts) builds one exam, for lists: names and verified
 * signatures in one query each for the whole page, and the stored record and estimate sent as saved, not parsed again.
 */
async function buildPage(rows: ExamModel[], codeOf: (row: ExamModel) => string): Promise<Exam[]> {
  if (!rows.length) return []
  const [users, teams, signatures] = await Promise.all([
    UserModel.findAll({
      attributes: ['id', 'displayName'],
      where: { id: { [Op.in]: [...new Set(rows.map((r) => r.examinerId))] } },
      raw: true,
    }),
    TeamModel.findAll({ attributes: ['id', 'name'], where: { id: { [Op.in]: [...new Set(rows.map((r) => r.teamId))] } }, raw: true }),
    signaturesOf(rows),
  ])
  const userNames = new Map(users.map((u) => [u.id, u.displayName]))
  const teamNames = new Map(teams.map((t) => [t.id, t.name]))
  return rows.map((row) => {
    const names = { examiner: userNames.get(row.examinerId) ?? '', team: teamNames.get(row.teamId) ?? '' }
    return examOf(row, codeOf(row), names, signatures.get(row.id) ?? [])
  })
}

// A signature with the attending's reading shows another exam, whose changes do not move this one's counter.
const cacheable = (exam: Exam) => !exam.signatures?.some((s) => s.attendingReading)

/**
 * A page of rows in the API's exam shape, as `present` (exam-record.ts) builds one exam. With a cache, rows whose
 * view is kept are not built again; only rows read fresh from the database may be passed with one, as a row saved
 * since it was read carries a stale change counter.
 */
export async function presentPage(rows: ExamModel[], codeOf: (row: ExamModel) => string, cache?: PageCache): Promise<Exam[]> {
  if (!cache) return buildPage(rows, codeOf)
  const keys = rows.map((row) => (row.syncSeq == null ? null : viewKey(row, codeOf(row) !== row.patientCode, cache.context)))
  const kept = keys.map((key) => (key === null ? undefined : cache.views.get(key)))
  const built = await buildPage(rows.filter((_, i) => !kept[i]), codeOf)
  const byId = new Map(built.map((exam) => [exam.id, exam]))
  return rows.map((row, i) => {
    if (kept[i]) return kept[i]
    const exam = byId.get(row.id)!
    const key = keys[i]
    if (key && cacheable(exam)) cache.views.set(key, exam)
    return exam
  })
}

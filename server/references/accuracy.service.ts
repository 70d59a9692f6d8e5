import { QueryTypes } from 'sequelize'
import { accuracyFromSums, boundOfBand, insideBand, type AccuracySums, type StoredBand } from '#shared/domain/accuracy'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { ACCURACY_POINTS_MAX, type AccuracyPoint, type AccuracyQuery, type AccuracySummary } from '#shared/schemas/reference'
import type { User } from '#shared/schemas/user'
import { AppError, invalidInput } from '../errors.ts'
import { queryDialect } from '../db/query-dialect.ts'
import { ReferenceModel } from '../models/index.ts'
import { teamIdsOf } from '../users/team-members.ts'
import { referenceWindow } from './reference-records.ts'

interface Filter {
  sql: string
  replacements: Record<string, unknown>
}

/** Educators read the whole program; attendings their own teams, and may narrow to one of them only. */
function teamsFor(user: User, query: AccuracyQuery): string[] | null {
  if (user.roles.includes('educator')) return query.teamId ? [query.teamId] : null
  const own = teamIdsOf(user)
  if (query.teamId && !own.includes(query.teamId))
    throw new AppError('not-your-team', 403, 'Attendings see the accuracy of their own teams only')
  return query.teamId ? [query.teamId] : own
}

/**
 * The pairs as SQL: a reference and its non-draft exam with an estimate and a band, measured within the window of the
 * exam. Times are compared as milliseconds (the database's own spelling from server/db/query-dialect.ts).
 */
function filterOf(user: User, query: AccuracyQuery, windowMinutes: number): Filter {
  const { epochMs, indexHint } = queryDialect(ReferenceModel.sequelize!)
  if (query.from && query.to && Date.parse(query.from) > Date.parse(query.to))
    throw invalidInput({ to: 'The end of the range is before its start' })
  const teams = teamsFor(user, query)
  const parts = [
    `e."status" != 'draft'`,
    // An exam with an estimate has a band, at least one end of it (not assessable has neither).
    `e."cvpCmH2O" IS NOT NULL`,
    `(e."bandLowCmH2O" IS NOT NULL OR e."bandHighCmH2O" IS NOT NULL)`,
    `abs(${epochMs('r."measuredAt"')} - ${epochMs('e."examinedAt"')}) <= :windowMs`,
    teams && (teams.length ? `e."teamId" IN (:teams)` : '0'),
    query.kind && `r."kind" = :kind`,
    query.from && `${epochMs('e."examinedAt"')} >= ${epochMs(':from')}`,
    query.to && `${epochMs('e."examinedAt"')} <= ${epochMs(':to')}`,
  ].filter((p): p is string => !!p)
  const replacements = { windowMs: windowMinutes * 60_000, teams, kind: query.kind, from: query.from, to: query.to }
  // Without table statistics SQLite would look exams up by their primary key and read each wide row (the estimate JSON
  // spills into overflow pages): 100,000 references took seconds. The covering index answers from the index alone.
  const from = `FROM "reference_measurements" r JOIN "exams" e ${indexHint('exams_accuracy')} ON e."id" = r."examId"`
  return { sql: `${from} WHERE ${parts.join(' AND ')}`, replacements }
}

const select = <T extends object>(sql: string, filter: Filter) =>
  ReferenceModel.sequelize!.query<T>(sql, { type: QueryTypes.SELECT, replacements: filter.replacements })

interface SumsRow {
  total: number
  inside: number | null
  n: number | null
  sum: number | null
  sumOfSquares: number | null
}

/**
 * The figures' sums over every pair in one aggregate row (accuracyFromSums in shared/domain/accuracy.ts does the rest):
 * the coverage rule is insideBand's, ends included and a bound's open side unlimited; differences of point estimates only.
 */
async function pairSums(filter: Filter): Promise<AccuracySums> {
  const point = `e."bandLowCmH2O" IS NOT NULL AND e."bandHighCmH2O" IS NOT NULL`
  const inside = `(e."bandLowCmH2O" IS NULL OR r."valueCmH2O" >= e."bandLowCmH2O") AND (e."bandHighCmH2O" IS NULL OR r."valueCmH2O" <= e."bandHighCmH2O")`
  const d = `(e."cvpCmH2O" - r."valueCmH2O")`
  const sums = [
    `COUNT(*) AS "total"`,
    `SUM(CASE WHEN ${inside} THEN 1 ELSE 0 END) AS "inside"`,
    `SUM(CASE WHEN ${point} THEN 1 ELSE 0 END) AS "n"`,
    `SUM(CASE WHEN ${point} THEN ${d} END) AS "sum"`,
    `SUM(CASE WHEN ${point} THEN ${d} * ${d} END) AS "sumOfSquares"`,
  ]
  const [row] = await select<SumsRow>(`SELECT ${sums.join(', ')} ${filter.sql}`, filter)
  const n = Number(row?.n ?? 0)
  return {
    differences: { n, sum: Number(row?.sum ?? 0), sumOfSquares: Number(row?.sumOfSquares ?? 0) },
    inside: Number(row?.inside ?? 0),
    total: Number(row?.total ?? 0),
  }
}

interface PointRow {
  examId: string
  kind: AccuracyPoint['kind']
  estimateCmH2O: number
  referenceCmH2O: number
  low: number | null
  high: number | null
}

/** The most recent pairs by time of exam, oldest of them first, for the plots. */
async function recentPoints(filter: Filter): Promise<AccuracyPoint[]> {
  const order = `ORDER BY e."examinedAt" DESC, r."measuredAt" DESC, r."id" DESC LIMIT ${ACCURACY_POINTS_MAX}`
  // The reference's covering index holds its id, so the sort reads no table row.
  const recent = `SELECT r."id" AS "referenceRow", e."examinedAt" AS "examinedAt", r."measuredAt" AS "measuredAt" ${filter.sql} ${order}`
  const columns = `e."id" AS "examId", r."kind" AS "kind", e."cvpCmH2O" AS "estimateCmH2O", r."valueCmH2O" AS "referenceCmH2O", e."bandLowCmH2O" AS "low", e."bandHighCmH2O" AS "high"`
  const joined = `SELECT ${columns} FROM (${recent}) t JOIN "reference_measurements" r ON r."id" = t."referenceRow" JOIN "exams" e ON e."id" = r."examId"`
  const rows = await select<PointRow>(`${joined} ORDER BY t."examinedAt" ASC, t."measuredAt" ASC, t."referenceRow" ASC`, filter)
  return rows.map(({ low, high, ...row }) => {
    const band: StoredBand = [low, high]
    return { ...row, bound: boundOfBand(band), band: [low, high], inside: insideBand(band, row.referenceCmH2O) }
  })
}

/** Accuracy of the estimate against measured pressures in the reader's scope (educators: all; attendings: their teams). */
export async function accuracySummary(user: User, query: AccuracyQuery): Promise<AccuracySummary> {
  const filter = filterOf(user, query, await referenceWindow())
  const [sums, points] = await Promise.all([pairSums(filter), recentPoints(filter)])
  return { ...accuracyFromSums(sums), points, caution: CAUTION_TEXT }
}

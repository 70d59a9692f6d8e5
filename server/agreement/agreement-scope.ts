import { Op, type WhereOptions } from 'sequelize'
import { veinMatches, type AgreementQuery } from '#shared/schemas/agreement'
import { VeinSchema } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { AppError } from '../errors.ts'
import { MembershipModel } from '../models/index.ts'
import type { PairRow } from './pair-rows.ts'
import type { Pair } from './pairs.ts'

export type PairWhere = WhereOptions<PairRow>

/** Which pairs a viewer may count, and on which of them the real patient code may be shown (README, Roles). */
export interface PairScope {
  /** The pairs the viewer may count, as a condition on `agreement_pairs`; null for every pair. */
  where: PairWhere | null
  showsCode(pair: Pair): boolean
  /** The examiner asked about: for residents always themselves. */
  examinerId?: string
}

const involves = (pair: Pair, examinerIds: ReadonlySet<string>) =>
  examinerIds.has(pair.first.examinerId) || examinerIds.has(pair.second.examinerId)
const filedTo = (pair: Pair, teamIds: ReadonlySet<string>) => teamIds.has(pair.first.teamId) || teamIds.has(pair.second.teamId)

/** Either side of the pair names one of `ids` in its `…ExaminerId` or `…TeamId` column. */
const eitherSide = (column: 'ExaminerId' | 'TeamId', ids: Iterable<string>): PairWhere[] => {
  const list = [...ids]
  return list.length ? [{ [`earlier${column}`]: { [Op.in]: list } }, { [`later${column}`]: { [Op.in]: list } }] : []
}

async function colleaguesOf(teamIds: ReadonlySet<string>): Promise<Set<string>> {
  const memberships = await MembershipModel.findAll({ where: { teamId: { [Op.in]: [...teamIds] } } })
  return new Set(memberships.map((m) => m.userId))
}

/**
 * Residents: pairs they took part in, and no one else's (asking about another examiner is refused). Attendings: pairs
 * involving a member of their teams or an exam filed to them, as they read those exams. Educators: the whole
 * program, with patient codes masked.
 */
export async function pairScopeOf(user: User, query: AgreementQuery): Promise<PairScope> {
  const roles = new Set(user.roles)
  const wide = roles.has('attending') || roles.has('educator')
  if (!wide && query.examinerId !== undefined && query.examinerId !== user.id)
    throw new AppError('forbidden', 403, 'Residents may see only their own agreement')
  const self = new Set(roles.has('resident') || roles.has('attending') ? [user.id] : [])
  const teamIds = new Set(roles.has('attending') ? user.teams.map((t) => t.id) : [])
  const colleagues = roles.has('attending') ? await colleaguesOf(teamIds) : new Set<string>()
  const showsCode = (pair: Pair) => involves(pair, self) || involves(pair, colleagues) || filedTo(pair, teamIds)
  const clinical = [...eitherSide('ExaminerId', new Set([...self, ...colleagues])), ...eitherSide('TeamId', teamIds)]
  // `IN ()` of nothing matches no pair: a viewer with no clinical role and no educator role counts none.
  const where = roles.has('educator') ? null : clinical.length ? { [Op.or]: clinical } : { earlierExamId: { [Op.in]: [] } }
  return { where, showsCode, examinerId: wide ? query.examinerId : user.id }
}

/** Both readings of the pair a point height: the pairs a difference, an ICC or a plot can take. */
export const POINT_PAIRS: PairWhere = { earlierColumnTop: 'seen', laterColumnTop: 'seen' }

/**
 * The query's own filters: the time of a pair is its earlier exam's (`pairedAt`), a team matches an exam filed to it,
 * an examiner either side of the pair, an inclination band the pair's mean inclination (stored), a vein both exams.
 */
export function pairFilter(query: AgreementQuery): PairWhere[] {
  const [from, to] = [query.from ? new Date(query.from) : null, query.to ? new Date(query.to) : null]
  if (from && to && from > to) throw new AppError('invalid-input', 400, 'Some fields need attention', { to: 'The end of the range is before its start' })
  const veins = query.vein ? VeinSchema.options.filter((v) => veinMatches(query.vein!, v)) : null
  const conditions: PairWhere[] = [
    ...(from ? [{ pairedAt: { [Op.gte]: from } }] : []),
    ...(to ? [{ pairedAt: { [Op.lte]: to } }] : []),
    ...(query.teamId ? [{ [Op.or]: eitherSide('TeamId', [query.teamId]) }] : []),
    ...(query.examinerId ? [{ [Op.or]: eitherSide('ExaminerId', [query.examinerId]) }] : []),
    ...(query.inclinationBand ? [{ inclinationBand: query.inclinationBand }] : []),
    ...(veins ? [{ earlierVein: { [Op.in]: veins }, laterVein: { [Op.in]: veins } }] : []),
  ]
  return conditions
}

/** The viewer's pairs matching the query: its filters (the examiner as the scope allows) and the scope together. */
export async function pairWhereFor(user: User, query: AgreementQuery): Promise<{ scope: PairScope; where: PairWhere }> {
  const scope = await pairScopeOf(user, query)
  const conditions = [...pairFilter({ ...query, examinerId: scope.examinerId }), ...(scope.where ? [scope.where] : [])]
  return { scope, where: { [Op.and]: conditions } }
}

import { Op } from 'sequelize'
import { inclinationBandOf, veinMatches, type AgreementQuery } from '#shared/schemas/agreement'
import type { User } from '#shared/schemas/user'
import { AppError } from '../errors.ts'
import { MembershipModel } from '../models/index.ts'
import type { Pair } from './pairs.ts'

/** Which pairs a viewer may count, and on which of them the real patient code may be shown (README, Roles). */
export interface PairScope {
  includes(pair: Pair): boolean
  showsCode(pair: Pair): boolean
  /** The examiner asked about: for residents always themselves. */
  examinerId?: string
}

const involves = (pair: Pair, examinerIds: ReadonlySet<string>) =>
  examinerIds.has(pair.first.examinerId) || examinerIds.has(pair.second.examinerId)
const filedTo = (pair: Pair, teamIds: ReadonlySet<string>) => teamIds.has(pair.first.teamId) || teamIds.has(pair.second.teamId)

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
  const self = new Set([user.id])
  const teamIds = new Set(user.teams.map((t) => t.id))
  const colleagues = roles.has('attending') ? await colleaguesOf(teamIds) : new Set<string>()
  const recordsExams = roles.has('resident') || roles.has('attending')
  const clinical = (pair: Pair) =>
    (recordsExams && involves(pair, self)) ||
    (roles.has('attending') && (involves(pair, colleagues) || filedTo(pair, teamIds)))
  const examinerId = wide ? query.examinerId : user.id
  return { includes: (pair) => roles.has('educator') || clinical(pair), showsCode: clinical, examinerId }
}

/** The time of a pair is the time of its earlier exam. */
export const pairTime = (pair: Pair) => Math.min(pair.first.at, pair.second.at)

/** The band of the pair's mean inclination (half-open bands, see INCLINATION_BANDS). */
export const pairInclinationBand = (pair: Pair) => inclinationBandOf((pair.first.inclinationDeg + pair.second.inclinationDeg) / 2)

/**
 * The query's own filters: a team matches an exam filed to it, an examiner either side of the pair, an inclination
 * band the pair's mean inclination, a vein both of its exams.
 */
export function pairFilter(query: AgreementQuery): (pair: Pair) => boolean {
  const from = query.from ? Date.parse(query.from) : -Infinity
  const to = query.to ? Date.parse(query.to) : Infinity
  if (from > to) throw new AppError('invalid-input', 400, 'Some fields need attention', { to: 'The end of the range is before its start' })
  const team = query.teamId ? new Set([query.teamId]) : null
  const examiner = query.examinerId ? new Set([query.examinerId]) : null
  const { inclinationBand: band, vein } = query
  return (pair) => {
    const at = pairTime(pair)
    return (
      at >= from &&
      at <= to &&
      (!team || filedTo(pair, team)) &&
      (!examiner || involves(pair, examiner)) &&
      (!band || pairInclinationBand(pair) === band) &&
      (!vein || (veinMatches(vein, pair.first.vein) && veinMatches(vein, pair.second.vein)))
    )
  }
}

import { Op, type Transaction } from 'sequelize'
import type { TeamRef, User } from '#shared/schemas/user'
import { MembershipModel, TeamModel } from '../models/index.ts'

type WithTeams = Pick<User, 'teams'>

export const teamIdsOf = (user: WithTeams): string[] => user.teams.map((t) => t.id)

export const belongsTo = (user: WithTeams, teamId: string): boolean => user.teams.some((t) => t.id === teamId)

/** Everyone on any of these teams; given a user's own teams, their colleagues (the user included). */
export async function membersOf(teamIds: Iterable<string>, transaction?: Transaction): Promise<Set<string>> {
  const memberships = await MembershipModel.findAll({ where: { teamId: { [Op.in]: [...teamIds] } }, attributes: ['userId'], transaction })
  return new Set(memberships.map((m) => m.userId))
}

/** Each account's teams, by team id (as SQLite's primary key index gives them, and auth-state.ts); accounts without a team are absent. */
export async function teamsOf(userIds: string[], transaction?: Transaction): Promise<Map<string, TeamRef[]>> {
  const order: [string, string][] = [['teamId', 'ASC']]
  const memberships = await MembershipModel.findAll({ where: { userId: { [Op.in]: userIds } }, order, transaction })
  const teams = await TeamModel.findAll({ where: { id: { [Op.in]: memberships.map((m) => m.teamId) } }, transaction })
  const byId = new Map(teams.map((t) => [t.id, { id: t.id, name: t.name }]))
  const result = new Map<string, TeamRef[]>()
  for (const m of memberships) {
    const team = byId.get(m.teamId)
    if (team) result.set(m.userId, [...(result.get(m.userId) ?? []), team])
  }
  return result
}

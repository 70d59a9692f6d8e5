import { Op } from 'sequelize'
import type { Role, Team, TeamRef, User } from '#shared/schemas/user'
import { MembershipModel, TeamModel, UserModel } from '../models/index.ts'
import { teamIdsOf, teamsOf } from './team-members.ts'

/** The account's roles, as the finder read them from `user_roles`. */
export function rolesOf(user: UserModel): Role[] {
  if (!user.roles) throw new Error(`The roles of account ${user.id} were not loaded`)
  return user.roles
}

function toUser(u: UserModel, teams: TeamRef[]): User {
  return { id: u.id, email: u.email, displayName: u.displayName, roles: rolesOf(u), active: u.active, teams }
}

export async function getUser(id: string): Promise<User | null> {
  const u = await UserModel.findByPk(id)
  if (!u) return null
  return toUser(u, (await teamsOf([u.id])).get(u.id) ?? [])
}

export async function listUsers(): Promise<User[]> {
  const users = await UserModel.findAll({ order: [['displayName', 'ASC']] })
  const teams = await teamsOf(users.map((u) => u.id))
  return users.map((u) => toUser(u, teams.get(u.id) ?? []))
}

/** Educators and admins see every team; everyone else sees the teams they belong to. */
export async function listTeamsFor(user: User): Promise<Team[]> {
  const all = user.roles.some((r) => r === 'educator' || r === 'admin')
  const where = all ? {} : { id: { [Op.in]: teamIdsOf(user) } }
  const teams = await TeamModel.findAll({ where, order: [['name', 'ASC']] })
  const memberships = await MembershipModel.findAll({ where: { teamId: { [Op.in]: teams.map((t) => t.id) } } })
  const users = await UserModel.findAll({ where: { id: { [Op.in]: memberships.map((m) => m.userId) }, active: true } })
  const byId = new Map(users.map((u) => [u.id, u]))
  return teams.map((t) => ({
    id: t.id,
    name: t.name,
    members: memberships
      .filter((m) => m.teamId === t.id)
      .flatMap((m) => {
        const u = byId.get(m.userId)
        return u ? [{ id: u.id, displayName: u.displayName, roles: rolesOf(u) }] : []
      })
      .sort((a, b) => a.displayName.localeCompare(b.displayName)),
  }))
}

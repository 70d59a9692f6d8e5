import { QueryTypes } from 'sequelize'
import { RoleSchema, type Role, type User } from '#shared/schemas/user'
import { quoteName } from '../db/quote.ts'
import { UserModel } from '../models/index.ts'

export interface AuthState {
  user: User
  passwordChangedAt: Date | null
}

/** One row per part: 'u' the account, 'r' a role, 't' a team; the columns after `part` mean what the part says. */
interface PartRow {
  part: 'u' | 'r' | 't'
  a: string
  b: string | null
  c: string | null
  active: boolean | number | null
  changedAt: Date | string | null
}

const [users, userRoles, memberships, teams] = ['users', 'user_roles', 'team_memberships', 'teams'].map(quoteName)
const [id, userId, teamId] = ['id', 'userId', 'teamId'].map(quoteName)

/**
 * The account, its roles and its teams (in team id order, as `teamsOf` gives them) in one statement, read afresh on
 * every request so a deactivation, a removed role or team, or a password change counts from the next request.
 * Plain SQL that SQLite and PostgreSQL both read: a UNION ALL of three small index reads.
 */
const SQL =
  [
    `SELECT 'u' AS "part", ${id} AS "a", "email" AS "b", "displayName" AS "c", "active" AS "active", "passwordChangedAt" AS "changedAt" FROM ${users} WHERE ${id} = :id`,
    `SELECT 'r', "role", NULL, NULL, NULL, NULL FROM ${userRoles} WHERE ${userId} = :id`,
    `SELECT 't', t.${id}, t."name", NULL, NULL, NULL FROM ${memberships} m JOIN ${teams} t ON t.${id} = m.${teamId} WHERE m.${userId} = :id`,
  ].join(' UNION ALL ') + ` ORDER BY "part" DESC, "a"`

// SQLite hands back its stored text ('2026-12-03 15:52:04.123 +00:00'), PostgreSQL a Date.
const asDate = (value: Date | string | null) => (value === null ? null : value instanceof Date ? value : new Date(value))

/** The account and when its password last changed, for requireAuth; null when there is no such account. */
export async function getAuthState(accountId: string): Promise<AuthState | null> {
  const rows = await UserModel.sequelize!.query<PartRow>(SQL, { type: QueryTypes.SELECT, replacements: { id: accountId } })
  const account = rows.find((r) => r.part === 'u')
  if (!account) return null
  const held = new Set(rows.filter((r) => r.part === 'r').map((r) => RoleSchema.parse(r.a)))
  const roles: Role[] = RoleSchema.options.filter((role) => held.has(role))
  const teamRefs = rows.filter((r) => r.part === 't').map((r) => ({ id: r.a, name: r.b ?? '' }))
  const user = { id: account.a, email: account.b ?? '', displayName: account.c ?? '', roles, active: !!account.active, teams: teamRefs }
  return { user, passwordChangedAt: asDate(account.changedAt) }
}

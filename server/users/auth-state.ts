import { QueryTypes } from 'sequelize'
import { RoleSchema, type Role, type User } from '#shared/schemas/user'
import { quoteName } from '../db/quote.ts'
import { UserModel } from '../models/index.ts'
import { DATA_VERSION_COLUMNS, dataVersionOf, type ExamDataVersion } from '../exams/exam-caches.ts'

/**
 * What the reader's exam scope and the cached exam answers' keys depend on besides the account (exams/exam-access.ts,
 * exams/exam-answers.ts), read in the account's statement: a cached read then costs one round trip to the database.
 */
export interface ReadFacts {
  /** Members of the reader's teams, the reader included: an attending reads their exams. */
  teammates: Set<string>
  /** Calibration rounds open now (their entries are blinded), and the closed rounds the reader examined in. */
  openRounds: string[]
  closedRoundsExamined: Set<string>
  dataVersion: ExamDataVersion
}

export interface AuthState {
  user: User
  passwordChangedAt: Date | null
  facts: ReadFacts
}

/**
 * One row per part: 'u' the account, 'r' a role, 't' a team, 'm' a teammate, 'o' an open round, 'c' a closed round
 * the reader examined in, 'v' the data version; the columns after `part` mean what the part says.
 */
interface PartRow {
  part: 'u' | 'r' | 't' | 'm' | 'o' | 'c' | 'v'
  a: string
  b: string | null
  c: string | null
  active: boolean | number | null
  changedAt: Date | string | null
}

const [users, userRoles, memberships, teams, rounds, examiners] = [
  'users',
  'user_roles',
  'team_memberships',
  'teams',
  'rounds',
  'round_examiners',
].map(quoteName)
const [id, userId, teamId, roundId, examinerId] = ['id', 'userId', 'teamId', 'roundId', 'examinerId'].map(quoteName)
const [versionE, versionU, versionT] = DATA_VERSION_COLUMNS

/**
 * The account, its roles and its teams (in team id order, as `teamsOf` gives them) and the read facts in one
 * statement, read afresh on every request so a deactivation, a removed role or team, or a password change counts
 * from the next request, and a cached answer is keyed by what is true now. Plain SQL that SQLite and PostgreSQL both
 * read: a UNION ALL of small index reads (the data version is one index read and two small tables). A teammate in two
 * of the reader's teams comes twice (a set drops it): DISTINCT would make PostgreSQL fix that branch's NULL columns as text.
 */
const SQL =
  [
    `SELECT 'u' AS "part", ${id} AS "a", "email" AS "b", "displayName" AS "c", "active" AS "active", "passwordChangedAt" AS "changedAt" FROM ${users} WHERE ${id} = :id`,
    `SELECT 'r', "role", NULL, NULL, NULL, NULL FROM ${userRoles} WHERE ${userId} = :id`,
    `SELECT 't', t.${id}, t."name", NULL, NULL, NULL FROM ${memberships} m JOIN ${teams} t ON t.${id} = m.${teamId} WHERE m.${userId} = :id`,
    `SELECT 'm', o.${userId}, NULL, NULL, NULL, NULL FROM ${memberships} m JOIN ${teams} t ON t.${id} = m.${teamId} JOIN ${memberships} o ON o.${teamId} = m.${teamId} WHERE m.${userId} = :id`,
    `SELECT 'o', ${id}, NULL, NULL, NULL, NULL FROM ${rounds} WHERE "status" = 'open'`,
    `SELECT 'c', r.${id}, NULL, NULL, NULL, NULL FROM ${examiners} e JOIN ${rounds} r ON r.${id} = e.${roundId} WHERE e.${examinerId} = :id AND r."status" = 'closed'`,
    `SELECT 'v', COALESCE(${versionE}, ''), ${versionU}, ${versionT}, NULL, NULL`,
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
  const ids = (part: PartRow['part']) => rows.filter((r) => r.part === part).map((r) => r.a)
  const version = rows.find((r) => r.part === 'v')
  const facts: ReadFacts = {
    teammates: new Set(ids('m')),
    openRounds: ids('o'),
    closedRoundsExamined: new Set(ids('c')),
    dataVersion: dataVersionOf(version?.a || null, version?.b ?? null, version?.c ?? null),
  }
  return { user, passwordChangedAt: asDate(account.changedAt), facts }
}

import { Op, type Transaction } from 'sequelize'
import type { Role } from '#shared/schemas/user'
import { MembershipModel, type UserModel } from '../models/index.ts'
import { rolesOf } from '../users/users.service.ts'

/**
 * How a new account starts (status `invited`): active, but without a password until its holder follows the invitation
 * link, so it cannot sign in before that.
 */
export const newAccountFields = () => ({ active: true, passwordHash: null }) as const

/** What an admin (on the Accounts screen or through a roster import) may change of an account; absent: unchanged. */
export interface AccountEdit {
  roles?: readonly Role[]
  displayName?: string
  /** Teams that exist (the caller checked), sorted and without repeats. */
  teamIds?: readonly string[]
}

/** One kind of change, as its audit event records it. */
export interface AccountChange {
  action: 'account-roles-changed' | 'account-renamed' | 'account-teams-changed'
  changes: Record<string, unknown>
}

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && [...a].sort().join() === [...b].sort().join()

async function replaceTeams(userId: string, after: readonly string[], transaction: Transaction): Promise<AccountChange | null> {
  const have = await MembershipModel.findAll({ where: { userId }, transaction })
  const before = have.map((m) => m.teamId).sort()
  if (sameSet(before, after)) return null
  const gone = before.filter((t) => !after.includes(t))
  if (gone.length) await MembershipModel.destroy({ where: { userId, teamId: { [Op.in]: gone } }, transaction })
  await MembershipModel.bulkCreate(after.filter((t) => !before.includes(t)).map((teamId) => ({ userId, teamId })), { transaction })
  return { action: 'account-teams-changed', changes: { teamIds: { from: before, to: [...after] } } }
}

/** Writes the values that differ; one change per kind (roles, name, teams), none for a value that stays as it is. */
export async function applyAccountEdit(u: UserModel, edit: AccountEdit, transaction: Transaction): Promise<AccountChange[]> {
  const made: AccountChange[] = []
  const before = rolesOf(u)
  const roles = edit.roles && [...new Set(edit.roles)]
  if (roles && !sameSet(before, roles)) {
    u.roles = roles
    made.push({ action: 'account-roles-changed', changes: { roles: { from: before, to: roles } } })
  }
  if (edit.displayName !== undefined && edit.displayName !== u.displayName) {
    made.push({ action: 'account-renamed', changes: { displayName: { from: u.displayName, to: edit.displayName } } })
    u.displayName = edit.displayName
  }
  if (made.length) await u.save({ transaction })
  const teams = edit.teamIds && (await replaceTeams(u.id, edit.teamIds, transaction))
  return teams ? [...made, teams] : made
}

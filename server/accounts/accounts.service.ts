import { randomUUID } from 'node:crypto'
import { Op, type Transaction, type WhereOptions } from 'sequelize'
import type { Account, AccountPage, AccountPatch, AccountQuery, InviteInput } from '#shared/schemas/account'
import type { Role, TeamRef, User } from '#shared/schemas/user'
import { audit, auditAll, type AuditEntry } from '../audit.ts'
import { containsText } from '../db/text-search.ts'
import { writeTransaction } from '../db/transaction.ts'
import { AppError, FIELDS_MESSAGE, invalidInput } from '../errors.ts'
import type { MailDeps } from '../mail/mailer.ts'
import { MembershipModel, RefreshSessionModel, TeamModel, UserModel, withRole } from '../models/index.ts'
import { membersOf, teamsOf } from '../users/team-members.ts'
import { rolesOf } from '../users/users.service.ts'
import { applyAccountEdit, newAccountFields, type AccountChange } from './account-edits.ts'
import { sendInvitation } from './invitations.ts'

function statusOf(u: UserModel): Account['status'] {
  if (!u.active) return 'deactivated'
  return u.passwordHash ? 'active' : 'invited'
}

async function sortedTeamsOf(userIds: string[], transaction?: Transaction): Promise<Map<string, TeamRef[]>> {
  const result = await teamsOf(userIds, transaction)
  for (const list of result.values()) list.sort((a, b) => a.name.localeCompare(b.name))
  return result
}

function toAccount(u: UserModel, teams: TeamRef[]): Account {
  return {
    id: u.id,
    email: u.email,
    displayName: u.displayName,
    roles: rolesOf(u),
    teams,
    active: u.active,
    status: statusOf(u),
    invitedAt: u.invitedAt?.toISOString() ?? null,
    deactivatedAt: u.deactivatedAt?.toISOString() ?? null,
    createdAt: u.createdAt.toISOString(),
  }
}

export async function getAccount(id: string, transaction?: Transaction): Promise<Account> {
  const u = await UserModel.findByPk(id, { transaction })
  if (!u) throw new AppError('not-found', 404, 'No such account')
  return toAccount(u, (await sortedTeamsOf([u.id], transaction)).get(u.id) ?? [])
}

/** Accounts by name, then id; the search matches name or e-mail anywhere, without case. */
export async function listAccounts(q: AccountQuery): Promise<AccountPage> {
  const where: WhereOptions[] = []
  if (q.search) {
    const contains = (column: string) => containsText(UserModel.sequelize!, column, q.search!)
    where.push({ [Op.or]: [contains('displayName'), contains('email')] })
  }
  if (q.role) where.push(withRole(q.role))
  if (q.teamId) {
    where.push({ id: { [Op.in]: [...(await membersOf([q.teamId]))] } })
  }
  if (q.active) where.push({ active: q.active === 'true' })
  const { rows, count } = await UserModel.findAndCountAll({
    where: { [Op.and]: where },
    order: [
      ['displayName', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  })
  const teams = await sortedTeamsOf(rows.map((u) => u.id))
  return { accounts: rows.map((u) => toAccount(u, teams.get(u.id) ?? [])), total: count, page: q.page, pageSize: q.pageSize }
}

async function checkTeams(teamIds: string[], transaction: Transaction): Promise<string[]> {
  const unique = [...new Set(teamIds)]
  const found = await TeamModel.count({ where: { id: { [Op.in]: unique } }, transaction })
  if (found !== unique.length) throw invalidInput({ teamIds: 'Choose teams from the list' })
  return unique.sort()
}

const write = <T>(work: (t: Transaction) => Promise<T>) =>
  writeTransaction(UserModel.sequelize!, work)


/** Creates an account without a usable password and e-mails the invitation (after the commit). */
export async function inviteAccount(input: InviteInput, actor: User, mail: MailDeps): Promise<Account> {
  return write(async (transaction) => {
    if (await UserModel.findOne({ where: { email: input.email }, transaction })) {
      throw new AppError('email-taken', 409, FIELDS_MESSAGE, { email: 'An account with this e-mail address already exists' })
    }
    const teamIds = await checkTeams(input.teamIds, transaction)
    const id = randomUUID()
    await UserModel.create(
      { id, email: input.email, displayName: input.displayName, roles: input.roles, ...newAccountFields() },
      { transaction },
    )
    await MembershipModel.bulkCreate(teamIds.map((teamId) => ({ userId: id, teamId })), { transaction })
    await audit(
      {
        actorId: actor.id,
        action: 'account-invited',
        entityType: 'user',
        entityId: id,
        changes: { email: input.email, displayName: input.displayName, roles: input.roles, teamIds },
      },
      { transaction },
    )
    await sendInvitation({ userId: id, invitedBy: actor.id, ...mail, transaction })
    return getAccount(id, transaction)
  })
}

/** Sends a fresh invitation link; the earlier one stops working. */
export async function resendInvitation(id: string, actor: User, mail: MailDeps): Promise<Account> {
  return write(async (transaction) => {
    await sendInvitation({ userId: id, invitedBy: actor.id, ...mail, transaction })
    return getAccount(id, transaction)
  })
}

async function otherActiveAdmins(exceptId: string, transaction: Transaction): Promise<number> {
  return UserModel.count({ where: { [Op.and]: [{ id: { [Op.ne]: exceptId }, active: true }, withRole('admin')] }, transaction })
}

/** Taking the admin role from the only active admin would leave nobody to manage accounts. */
async function checkKeepsAdmin(u: UserModel, roles: readonly Role[] | undefined, transaction: Transaction): Promise<void> {
  if (!roles || roles.includes('admin') || !rolesOf(u).includes('admin') || !u.active) return
  if ((await otherActiveAdmins(u.id, transaction)) > 0) return
  throw new AppError('last-admin', 409, FIELDS_MESSAGE, { roles: 'This is the only active admin; make someone else an admin first' })
}

/** Changes roles, teams and the display name; one audit event per kind of change. Keeps at least one active admin. */
export async function updateAccount(id: string, patch: AccountPatch, actor: User): Promise<Account> {
  return write(async (transaction) => {
    const u = await UserModel.findByPk(id, { transaction })
    if (!u) throw new AppError('not-found', 404, 'No such account')
    await checkKeepsAdmin(u, patch.roles, transaction)
    const teamIds = patch.teamIds && (await checkTeams(patch.teamIds, transaction))
    const made = await applyAccountEdit(u, { ...patch, teamIds }, transaction)
    const entry = ({ action, changes }: AccountChange): AuditEntry => ({ actorId: actor.id, action, entityType: 'user', entityId: u.id, changes })
    if (made.length) await auditAll(made.map(entry), { transaction })
    return getAccount(u.id, transaction)
  })
}

/** The account can no longer sign in, and every refresh session it holds is revoked in the same transaction. */
export async function deactivateAccount(id: string, actor: User): Promise<Account> {
  return write(async (transaction) => {
    const u = await UserModel.findByPk(id, { transaction })
    if (!u) throw new AppError('not-found', 404, 'No such account')
    if (u.id === actor.id) throw new AppError('self-deactivation', 409, 'You cannot deactivate your own account')
    if (!u.active) return getAccount(u.id, transaction)
    if (rolesOf(u).includes('admin') && (await otherActiveAdmins(u.id, transaction)) === 0) {
      throw new AppError('last-admin', 409, 'This is the only active admin; make someone else an admin first')
    }
    const now = new Date()
    u.active = false
    u.deactivatedAt = now
    await u.save({ transaction })
    const [revoked] = await RefreshSessionModel.update({ revokedAt: now }, { where: { userId: u.id, revokedAt: null }, transaction })
    await audit(
      { actorId: actor.id, action: 'account-deactivated', entityType: 'user', entityId: u.id, changes: { revokedSessions: revoked } },
      { transaction },
    )
    return getAccount(u.id, transaction)
  })
}

/** Lets the account sign in again with its old password (or its invitation, if it never chose one). */
export async function reactivateAccount(id: string, actor: User): Promise<Account> {
  return write(async (transaction) => {
    const u = await UserModel.findByPk(id, { transaction })
    if (!u) throw new AppError('not-found', 404, 'No such account')
    if (u.active) return getAccount(u.id, transaction)
    u.active = true
    u.deactivatedAt = null
    await u.save({ transaction })
    await audit({ actorId: actor.id, action: 'account-reactivated', entityType: 'user', entityId: u.id }, { transaction })
    return getAccount(u.id, transaction)
  })
}

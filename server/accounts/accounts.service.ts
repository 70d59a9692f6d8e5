import { randomUUID } from 'node:crypto'
import { Op, type Transaction, type WhereOptions } from 'sequelize'
import type { Account, AccountPage, AccountPatch, AccountQuery, InviteInput } from '#shared/schemas/account'
import type { Role, TeamRef, User } from '#shared/schemas/user'
import { audit, auditAll, type AuditEntry } from '../audit.ts'
import { writeTransaction } from '../db/transaction.ts'
import { AppError } from '../errors.ts'
import type { Mailer } from '../mail/mailer.ts'
import { MembershipModel, RefreshSessionModel, TeamModel, UserModel, withRole } from '../models/index.ts'
import { rolesOf } from '../users/users.service.ts'
import { sendInvitation } from './invitations.ts'

function statusOf(u: UserModel): Account['status'] {
  if (!u.active) return 'deactivated'
  return u.passwordHash ? 'active' : 'invited'
}

async function teamsOf(userIds: string[], transaction?: Transaction): Promise<Map<string, TeamRef[]>> {
  const memberships = await MembershipModel.findAll({ where: { userId: { [Op.in]: userIds } }, transaction })
  const teams = await TeamModel.findAll({ where: { id: { [Op.in]: memberships.map((m) => m.teamId) } }, transaction })
  const byId = new Map(teams.map((t) => [t.id, { id: t.id, name: t.name }]))
  const result = new Map<string, TeamRef[]>()
  for (const m of memberships) {
    const team = byId.get(m.teamId)
    if (team) result.set(m.userId, [...(result.get(m.userId) ?? []), team])
  }
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
  return toAccount(u, (await teamsOf([u.id], transaction)).get(u.id) ?? [])
}

/** Accounts by name, then id; the search matches name or e-mail anywhere, without case (instr: no wildcards to escape). */
export async function listAccounts(q: AccountQuery): Promise<AccountPage> {
  const where: WhereOptions[] = []
  if (q.search) {
    const db = UserModel.sequelize!
    const needle = q.search.toLowerCase()
    const contains = (column: string) => db.where(db.fn('instr', db.fn('lower', db.col(column)), needle), { [Op.gt]: 0 })
    where.push({ [Op.or]: [contains('displayName'), contains('email')] })
  }
  if (q.role) where.push(withRole(q.role))
  if (q.teamId) {
    const members = await MembershipModel.findAll({ where: { teamId: q.teamId }, attributes: ['userId'] })
    where.push({ id: { [Op.in]: members.map((m) => m.userId) } })
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
  const teams = await teamsOf(rows.map((u) => u.id))
  return { accounts: rows.map((u) => toAccount(u, teams.get(u.id) ?? [])), total: count, page: q.page, pageSize: q.pageSize }
}

async function checkTeams(teamIds: string[], transaction: Transaction): Promise<string[]> {
  const unique = [...new Set(teamIds)]
  const found = await TeamModel.count({ where: { id: { [Op.in]: unique } }, transaction })
  if (found !== unique.length) throw new AppError('invalid-input', 400, 'Some fields need attention', { teamIds: 'Choose teams from the list' })
  return unique.sort()
}

const write = <T>(work: (t: Transaction) => Promise<T>) =>
  writeTransaction(UserModel.sequelize!, work)

export interface AccountMailOptions {
  mailer?: Mailer
  baseUrl: string
}

/** Creates an account without a usable password and e-mails the invitation (after the commit). */
export async function inviteAccount(input: InviteInput, actor: User, mail: AccountMailOptions): Promise<Account> {
  return write(async (transaction) => {
    if (await UserModel.findOne({ where: { email: input.email }, transaction })) {
      throw new AppError('email-taken', 409, 'Some fields need attention', { email: 'An account with this e-mail address already exists' })
    }
    const teamIds = await checkTeams(input.teamIds, transaction)
    const id = randomUUID()
    await UserModel.create(
      { id, email: input.email, displayName: input.displayName, passwordHash: null, roles: input.roles, active: true },
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
    await sendInvitation({ userId: id, invitedBy: actor.id, mailer: mail.mailer, baseUrl: mail.baseUrl, transaction })
    return getAccount(id, transaction)
  })
}

/** Sends a fresh invitation link; the earlier one stops working. */
export async function resendInvitation(id: string, actor: User, mail: AccountMailOptions): Promise<Account> {
  return write(async (transaction) => {
    await sendInvitation({ userId: id, invitedBy: actor.id, mailer: mail.mailer, baseUrl: mail.baseUrl, transaction })
    return getAccount(id, transaction)
  })
}

async function otherActiveAdmins(exceptId: string, transaction: Transaction): Promise<number> {
  return UserModel.count({ where: { [Op.and]: [{ id: { [Op.ne]: exceptId }, active: true }, withRole('admin')] }, transaction })
}

const sameSet = (a: readonly string[], b: readonly string[]) => a.length === b.length && [...a].sort().join() === [...b].sort().join()

/** Changes roles, teams and the display name; one audit event per kind of change. Keeps at least one active admin. */
export async function updateAccount(id: string, patch: AccountPatch, actor: User): Promise<Account> {
  return write(async (transaction) => {
    const u = await UserModel.findByPk(id, { transaction })
    if (!u) throw new AppError('not-found', 404, 'No such account')
    const events: AuditEntry[] = []
    const event = (action: string, changes: Record<string, unknown>) =>
      events.push({ actorId: actor.id, action, entityType: 'user', entityId: u.id, changes })

    if (patch.roles) {
      const before = rolesOf(u)
      const after = [...new Set(patch.roles)] as Role[]
      if (before.includes('admin') && !after.includes('admin') && u.active && (await otherActiveAdmins(u.id, transaction)) === 0) {
        throw new AppError('last-admin', 409, 'Some fields need attention', {
          roles: 'This is the only active admin; make someone else an admin first',
        })
      }
      if (!sameSet(before, after)) {
        u.roles = after
        event('account-roles-changed', { roles: { from: before, to: after } })
      }
    }
    if (patch.displayName !== undefined && patch.displayName !== u.displayName) {
      event('account-renamed', { displayName: { from: u.displayName, to: patch.displayName } })
      u.displayName = patch.displayName
    }
    if (patch.teamIds) {
      const after = await checkTeams(patch.teamIds, transaction)
      const have = await MembershipModel.findAll({ where: { userId: u.id }, transaction })
      const before = have.map((m) => m.teamId).sort()
      if (!sameSet(before, after)) {
        const gone = before.filter((t) => !after.includes(t))
        const added = after.filter((t) => !before.includes(t))
        if (gone.length) await MembershipModel.destroy({ where: { userId: u.id, teamId: { [Op.in]: gone } }, transaction })
        await MembershipModel.bulkCreate(added.map((teamId) => ({ userId: u.id, teamId })), { transaction })
        event('account-teams-changed', { teamIds: { from: before, to: after } })
      }
    }
    if (events.length) {
      await u.save({ transaction })
      await auditAll(events, { transaction })
    }
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

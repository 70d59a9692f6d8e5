import { randomUUID } from 'node:crypto'
import { col, fn, Op, where, type Transaction } from 'sequelize'
import { z } from 'zod'
import type { RosterChanges, RosterCounts, RosterPreview, RosterRow } from '#shared/schemas/roster'
import { RoleSchema, type Role, type User } from '#shared/schemas/user'
import { applyAccountEdit, newAccountFields } from '../accounts/account-edits.ts'
import { sendInvitation } from '../accounts/invitations.ts'
import { auditAll, type AuditEntry } from '../audit.ts'
import { writeTransaction } from '../db/transaction.ts'
import type { MailDeps } from '../mail/mailer.ts'
import { MembershipModel, TeamModel, UserModel } from '../models/index.ts'
import { rolesOf } from '../users/users.service.ts'
import type { RosterFile, RosterLine } from './roster-file.ts'

const ROLES = RoleSchema.options
const EmailSchema = z.email()
const MAX_EMAIL = 254
const MAX_NAME = 120
// C0 and C1 control characters (tab and line breaks included): a display name is one line of text. Also the
// bidirectional embedding, override and isolate controls (Unicode UAX #9), which can make a name display as another.
const CONTROL = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/u

/** A row that passed every check, with what it should make of the account. */
interface Target {
  row: RosterRow
  email: string
  displayName: string
  roles: Role[]
  teams: TeamModel[]
  existing?: UserModel
}

interface Classified {
  preview: RosterPreview
  targets: Target[]
}

const byName = (a: string, b: string) => a.localeCompare(b)
const canonicalRoles = (roles: Iterable<Role>) => ROLES.filter((r) => [...roles].includes(r))
const sameList = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i])
const splitList = (cell: string) => cell.split(/[;|]/).map((s) => s.trim()).filter(Boolean)

function readRoles(cell: string): { roles: Role[]; reason?: string } {
  const names = [...new Set(cell.split(/[;|,]/).map((s) => s.trim().toLowerCase()).filter(Boolean))]
  if (names.length === 0) return { roles: [], reason: `Missing roles: give at least one of ${ROLES.join(', ')}.` }
  const unknown = names.filter((n) => !(ROLES as readonly string[]).includes(n))
  if (unknown.length) {
    const list = unknown.map((n) => `"${n}"`).join(', ')
    return { roles: [], reason: `Unknown role${unknown.length > 1 ? 's' : ''} ${list}; roles are ${ROLES.join(', ')}.` }
  }
  return { roles: canonicalRoles(names as Role[]) }
}

/** Team names separated by `;` or `|`, unless the whole cell is one team's name; every team must exist. */
function readTeams(cell: string, teams: Map<string, TeamModel>): { teams: TeamModel[]; reason?: string } {
  const whole = teams.get(cell.toLowerCase())
  const names = whole ? [cell] : splitList(cell)
  const unknown = names.filter((n) => !teams.has(n.toLowerCase()))
  if (unknown.length) {
    const list = unknown.map((n) => `"${n}"`).join(', ')
    const known = [...teams.values()].map((t) => t.name).sort(byName)
    const hint = known.length && known.length <= 12 ? ` Teams are: ${known.join('; ')}.` : ''
    return {
      teams: [],
      reason: `No team is named ${list}; the import does not create teams.${hint}`,
    }
  }
  const found = new Map(names.map((n) => teams.get(n.toLowerCase())!).map((t) => [t.id, t]))
  return { teams: [...found.values()].sort((a, b) => byName(a.name, b.name)) }
}

function readEmail(cell: string): { email: string; reason?: string } {
  const email = cell.toLowerCase()
  if (!email) return { email, reason: 'Missing e-mail address.' }
  if (email.length > MAX_EMAIL) return { email, reason: `The e-mail address is longer than ${MAX_EMAIL} characters.` }
  if (!EmailSchema.safeParse(email).success) return { email, reason: `"${cell}" is not a valid e-mail address.` }
  return { email }
}

function readDisplayName(cell: string): string | undefined {
  if (!cell) return 'Missing display name.'
  if (cell.length > MAX_NAME) return `The display name is longer than ${MAX_NAME} characters.`
  if (CONTROL.test(cell)) return 'The display name contains a control character such as a line break or a tab.'
  return undefined
}

function duplicateLines(lines: RosterLine[]): Map<number, number[]> {
  const seen = new Map<string, number[]>()
  for (const l of lines) {
    const key = l.email.toLowerCase()
    if (key) seen.set(key, [...(seen.get(key) ?? []), l.line])
  }
  const others = new Map<number, number[]>()
  for (const group of seen.values()) {
    if (group.length > 1) for (const line of group) others.set(line, group.filter((g) => g !== line))
  }
  return others
}

async function accountsByEmail(emails: string[], transaction?: Transaction) {
  const users = emails.length
    ? await UserModel.findAll({ where: where(fn('lower', col('email')), { [Op.in]: emails }), transaction })
    : []
  const memberships = await MembershipModel.findAll({ where: { userId: { [Op.in]: users.map((u) => u.id) } }, transaction })
  const teamIds = new Map<string, string[]>()
  for (const m of memberships) teamIds.set(m.userId, [...(teamIds.get(m.userId) ?? []), m.teamId])
  return { users: new Map(users.map((u) => [u.email.toLowerCase(), u])), teamIds }
}

function countsOf(rows: RosterRow[]): RosterCounts {
  const counts = { new: 0, changed: 0, unchanged: 0, invalid: 0 }
  for (const r of rows) counts[r.status] += 1
  return counts
}

/** Checks every row and compares it with the stored account of the same e-mail (case-insensitive). Writes nothing. */
async function classify(file: RosterFile, actor: User, transaction?: Transaction): Promise<Classified> {
  const allTeams = await TeamModel.findAll({ transaction })
  const teamsByName = new Map(allTeams.map((t) => [t.name.toLowerCase(), t]))
  const teamNames = new Map(allTeams.map((t) => [t.id, t.name]))
  const duplicates = duplicateLines(file.lines)
  const validEmails = file.lines.map((l) => readEmail(l.email)).flatMap((e) => (e.reason ? [] : [e.email]))
  const { users, teamIds } = await accountsByEmail([...new Set(validEmails)], transaction)

  const targets: Target[] = []
  const rows = file.lines.map((l): RosterRow => {
    const reasons: NonNullable<RosterRow['reasons']> = {}
    const email = readEmail(l.email)
    const roles = readRoles(l.roles)
    const teams = readTeams(l.team, teamsByName)
    const nameReason = readDisplayName(l.displayName)
    if (l.rowProblem) reasons.row = l.rowProblem
    if (email.reason) reasons.email = email.reason
    else if (duplicates.has(l.line)) {
      const others = duplicates.get(l.line)!
      reasons.email = `Duplicate e-mail address: also on line${others.length > 1 ? 's' : ''} ${others.join(', ')}.`
    }
    if (nameReason) reasons.displayName = nameReason
    if (roles.reason) reasons.roles = roles.reason
    if (teams.reason) reasons.team = teams.reason
    const existing = email.reason ? undefined : users.get(email.email)
    if (existing?.id === actor.id && !roles.reason && !roles.roles.includes('admin')) {
      reasons.roles = 'This is your own account: an import cannot take away your admin role.'
    }
    const base = {
      line: l.line,
      email: email.email,
      displayName: l.displayName,
      roles: roles.reason ? splitList(l.roles.replaceAll(',', ';')) : roles.roles,
      teams: teams.reason ? splitList(l.team) : teams.teams.map((t) => t.name),
    }
    if (Object.keys(reasons).length) return { ...base, status: 'invalid', reasons }

    const target: Target = { row: undefined!, email: email.email, displayName: l.displayName, roles: roles.roles, teams: teams.teams, existing }
    let row: RosterRow
    if (!existing) row = { ...base, status: 'new' }
    else {
      const changes: RosterChanges = {}
      if (existing.displayName !== l.displayName) changes.displayName = { from: existing.displayName, to: l.displayName }
      const before = canonicalRoles(rolesOf(existing))
      if (!sameList(before, roles.roles)) changes.roles = { from: before, to: roles.roles }
      const beforeTeams = (teamIds.get(existing.id) ?? []).map((id) => teamNames.get(id) ?? id).sort(byName)
      const afterTeams = teams.teams.map((t) => t.name)
      if (!sameList(beforeTeams, afterTeams)) changes.teams = { from: beforeTeams, to: afterTeams }
      const notes = existing.active ? [] : ['The account is deactivated; the import does not reactivate it.']
      row = Object.keys(changes).length ? { ...base, status: 'changed', changes } : { ...base, status: 'unchanged' }
      if (notes.length) row.notes = notes
    }
    target.row = row
    targets.push(target)
    return row
  })
  return { preview: { rows, counts: countsOf(rows), ignoredColumns: file.ignoredColumns }, targets }
}

/** What importing the roster would do, row by row. */
export async function previewRoster(file: RosterFile, actor: User): Promise<RosterPreview> {
  return (await classify(file, actor)).preview
}

export interface AppliedRoster {
  preview: RosterPreview
  created: number
  updated: number
  skipped: number
}


// Audit actions and shapes as the Accounts screen writes them (server/accounts/accounts.service.ts), plus the source.
const SOURCE = { source: 'roster-import' } as const

/** Creates the new accounts with three statements, whatever their number; returns their audit events. */
async function createAccounts(targets: Target[], actor: User, transaction: Transaction): Promise<AuditEntry[]> {
  const made = targets.map((target) => ({ target, id: randomUUID(), teamIds: target.teams.map((t) => t.id).sort() }))
  await UserModel.bulkCreate(
    made.map(({ target, id }) => ({
      id,
      email: target.email,
      displayName: target.displayName,
      roles: target.roles,
      ...newAccountFields(),
    })),
    { transaction },
  )
  await MembershipModel.bulkCreate(made.flatMap(({ id, teamIds }) => teamIds.map((teamId) => ({ userId: id, teamId }))), { transaction })
  return made.map(({ target, id, teamIds }) => ({
    actorId: actor.id,
    action: 'account-invited',
    entityType: 'user',
    entityId: id,
    changes: { email: target.email, displayName: target.displayName, roles: target.roles, teamIds, ...SOURCE },
  }))
}

/** Writes the row's changes through the Accounts screen's own edit; its audit events also name the teams and the source. */
async function updateAccount(target: Target, actor: User, transaction: Transaction): Promise<AuditEntry[]> {
  const user = target.existing!
  const changes = target.row.changes ?? {}
  const edit = {
    roles: changes.roles && target.roles,
    displayName: changes.displayName && target.displayName,
    teamIds: changes.teams && target.teams.map((t) => t.id).sort(),
  }
  const made = await applyAccountEdit(user, edit, transaction)
  return made.map(({ action, changes: change }) => {
    const teams = action === 'account-teams-changed' ? { teams: changes.teams } : {}
    return { actorId: actor.id, action, entityType: 'user', entityId: user.id, changes: { ...change, ...teams, ...SOURCE } }
  })
}

/**
 * Applies the roster in one transaction: creates the new accounts and their invitation links, updates the changed
 * ones, skips the invalid rows (and reports them), and never touches accounts the file does not name. Appends the
 * Accounts screen's audit events for each account written (an invitation, a rename, new roles, new teams) and one
 * `roster-import` event with the counts; an import that changes nothing writes nothing at all. The invitation
 * e-mails leave only once the transaction has committed; if anything fails, nothing is written and nothing is sent.
 */
export async function applyRoster(file: RosterFile, actor: User, invitations: MailDeps): Promise<AppliedRoster> {
  return writeTransaction(UserModel.sequelize!, async (transaction) => {
    // Checked again inside the transaction: the preview the admin saw may be stale, and the client's copy is not trusted.
    const { preview, targets } = await classify(file, actor, transaction)
    const created = await createAccounts(targets.filter((t) => t.row.status === 'new'), actor, transaction)
    const events: AuditEntry[] = [...created]
    for (const target of targets) if (target.row.status === 'changed') events.push(...(await updateAccount(target, actor, transaction)))
    const { counts } = preview
    if (events.length === 0) return { preview, created: 0, updated: 0, skipped: counts.invalid }
    events.push({
      actorId: actor.id,
      action: 'roster-import',
      entityType: 'roster',
      changes: { rows: preview.rows.length, created: counts.new, updated: counts.changed, unchanged: counts.unchanged, skipped: counts.invalid },
    })
    await auditAll(events, { transaction })
    for (const { entityId } of created) await sendInvitation({ userId: entityId!, invitedBy: actor.id, ...invitations, transaction })
    return { preview, created: counts.new, updated: counts.changed, skipped: counts.invalid }
  })
}

import { Op, type Sequelize, type Transaction } from 'sequelize'
import {
  settingsChanges,
  withDefaults,
  type AppSettingsUpdate,
  type SettingsHistoryEntry,
  type SettingsVersion,
} from '#shared/schemas/settings'
import type { User } from '#shared/schemas/user'
import { deriveAllPairs } from '../agreement/pair-derivation.ts'
import { audit } from '../audit.ts'
import { writeTransaction } from '../db/transaction.ts'
import { AppError } from '../errors.ts'
import { SettingsVersionModel, UserModel } from '../models/index.ts'

export interface SettingsChange {
  before: SettingsVersion
  after: SettingsVersion
}

const HISTORY_LENGTH = 20
// Per database, so each test's fresh database reads its own settings; replaced, never mutated, when a newer version is
// seen. Several app servers may share the database: the cached copy is only used while it is still the latest version.
const cache = new WeakMap<Sequelize, SettingsVersion>()
const listeners: ((change: SettingsChange) => void)[] = []

const present = (row: SettingsVersionModel): SettingsVersion => ({
  version: row.version,
  values: withDefaults(JSON.parse(row.values)),
  changedAt: row.changedAt.toISOString(),
})

async function latestRow(transaction?: Transaction): Promise<SettingsVersionModel> {
  const row = await SettingsVersionModel.findOne({ order: [['version', 'DESC']], transaction })
  if (!row) throw new Error('No settings stored: the settings migration seeds version 1')
  return row
}

/** The number of the newest stored version: the end of the primary key, one row read whichever server saved it. */
export async function latestSettingsVersion(): Promise<number> {
  return Number(await SettingsVersionModel.max('version'))
}

/**
 * The settings in force and their version, for any server code (the estimate, pairing, photos). Each call reads the
 * newest version number; the values are read and parsed again only when it differs from the copy in memory, so a
 * save through any app server is in force on every other from its next call.
 */
export async function currentSettings(): Promise<SettingsVersion> {
  const sequelize = SettingsVersionModel.sequelize!
  const [latest, held] = [await latestSettingsVersion(), cache.get(sequelize)]
  if (held?.version === latest) return held
  const fresh = present(await latestRow())
  cache.set(sequelize, fresh)
  return fresh
}

/** Calls `listener` after each saved change (not for a save that changes nothing), e.g. to drop caches built on the old values. */
export function onSettingsChange(listener: (change: SettingsChange) => void): void {
  listeners.push(listener)
}

/** One stored version; 404 when there is none. */
export async function settingsVersion(version: number): Promise<SettingsVersion> {
  const row = await SettingsVersionModel.findByPk(version)
  if (!row) throw new AppError('settings-version-not-found', 404, `There is no settings version ${version}`)
  return present(row)
}

/**
 * Saves the admin's settings as a new version, audited with the before/after of each changed value. A save based on
 * an older version answers 409 with the newer one; a save that changes nothing adds no version.
 */
export async function updateSettings(admin: User, input: AppSettingsUpdate): Promise<SettingsVersion> {
  const { baseVersion, ...values } = input
  const sequelize = SettingsVersionModel.sequelize!
  const { saved, change } = await writeTransaction(sequelize, async (transaction) => {
    const latest = await latestRow(transaction)
    const before = present(latest)
    if (latest.version !== baseVersion)
      throw new AppError('stale-settings', 409, 'Someone saved newer settings after you opened them', undefined, { settings: before })
    const changes = settingsChanges(before.values, values)
    if (!Object.keys(changes).length) return { saved: before, change: null }
    const row = await SettingsVersionModel.create({ version: latest.version + 1, values: JSON.stringify(values), changedBy: admin.id, changedAt: new Date() }, { transaction })
    if (changes.pairWindowMinutes) await deriveAllPairs({ sequelize, transaction }, values.pairWindowMinutes)
    const version = { from: latest.version, to: row.version }
    await audit({ actorId: admin.id, action: 'settings-update', entityType: 'settings', entityId: String(row.version), changes: { ...changes, version } }, { transaction })
    return { saved: present(row), change: { before, after: present(row) } }
  })
  cache.set(sequelize, saved)
  if (change) for (const listener of listeners) listener(change)
  return saved
}

/** The latest versions, newest first, each with who saved it and what it changed against the version before. */
export async function settingsHistory(): Promise<SettingsHistoryEntry[]> {
  const rows = await SettingsVersionModel.findAll({ order: [['version', 'DESC']], limit: HISTORY_LENGTH + 1 })
  const authorIds = [...new Set(rows.flatMap((r) => (r.changedBy ? [r.changedBy] : [])))]
  const authors = await UserModel.findAll({ where: { id: { [Op.in]: authorIds } } })
  const names = new Map(authors.map((u) => [u.id, u.displayName]))
  const versions = rows.map(present)
  return versions.slice(0, HISTORY_LENGTH).map((v, i) => {
    const by = rows[i]!.changedBy
    const previous = versions[i + 1]
    // The oldest version shown is compared with the one before it; version 1 has nothing before it.
    const changes = v.version === 1 || !previous ? {} : settingsChanges(previous.values, v.values)
    return { ...v, changedBy: by ? { id: by, displayName: names.get(by) ?? '' } : null, changes }
  })
}

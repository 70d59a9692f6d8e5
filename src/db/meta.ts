import { defaultObserverTerm } from '#shared/domain/estimate'
import { ObserverTermSchema } from '#shared/schemas/exam'
import { SettingsVersionSchema, type SettingsInForce, type SettingsVersion } from '#shared/schemas/settings'
import { UserSchema, type User } from '#shared/schemas/user'
import { db } from './index'

export const cursorKey = (userId: string) => `pull-cursor:${userId}`
const lastSyncKey = (userId: string) => `last-sync:${userId}`
const PROFILE_KEY = 'profile'

/** Where the user's last pull stopped; 0 before the first one. */
export async function loadCursor(userId: string): Promise<number> {
  const row = await db.meta.get(cursorKey(userId))
  return typeof row?.value === 'number' ? row.value : 0
}

export async function loadLastSync(userId: string): Promise<string | null> {
  const row = await db.meta.get(lastSyncKey(userId))
  return typeof row?.value === 'string' ? row.value : null
}

export async function saveLastSync(userId: string, at: string): Promise<void> {
  await db.meta.put({ key: lastSyncKey(userId), value: at })
}

/** Keeps the signed-in profile, so the app can open and record offline after a reload. */
export async function saveProfile(user: User): Promise<void> {
  await db.meta.put({ key: PROFILE_KEY, value: JSON.parse(JSON.stringify(user)) })
}

export async function loadProfile(): Promise<User | null> {
  const parsed = UserSchema.safeParse((await db.meta.get(PROFILE_KEY))?.value)
  return parsed.success ? parsed.data : null
}

const SETTINGS_KEY = 'settings'

const settingsVersionKey = (version: number) => `settings-version:${version}`

/** Keeps the settings in force, so estimates on this device use them offline too (and, by number, for past estimates). */
export async function saveSettingsCopy(settings: SettingsInForce): Promise<void> {
  const value = JSON.parse(JSON.stringify(settings))
  await db.meta.bulkPut([
    { key: SETTINGS_KEY, value },
    { key: settingsVersionKey(settings.version), value },
  ])
}

/** Keeps one version by number (versions never change once saved), so past estimates read offline too. */
export async function saveSettingsVersionCopy(settings: SettingsVersion): Promise<void> {
  await db.meta.put({ key: settingsVersionKey(settings.version), value: JSON.parse(JSON.stringify(settings)) })
}

export async function loadSettingsVersionCopy(version: number): Promise<SettingsVersion | null> {
  const parsed = SettingsVersionSchema.safeParse((await db.meta.get(settingsVersionKey(version)))?.value)
  return parsed.success && parsed.data.version === version ? parsed.data : null
}

// Copies kept by earlier app versions carry no error term: those versions always estimated with the default one.
const KeptSettingsSchema = SettingsVersionSchema.extend({ observerTerm: ObserverTermSchema.optional() })

/** The settings in force as last received, with their error term (the default term for an older copy without one). */
export async function loadSettingsCopy(): Promise<SettingsInForce | null> {
  const parsed = KeptSettingsSchema.safeParse((await db.meta.get(SETTINGS_KEY))?.value)
  if (!parsed.success) return null
  return { ...parsed.data, observerTerm: parsed.data.observerTerm ?? defaultObserverTerm(parsed.data.values.estimate) }
}

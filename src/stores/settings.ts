import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { OffsetModel } from '#shared/schemas/exam'
import {
  DEFAULT_APP_SETTINGS,
  DEFAULT_ESTIMATE_SETTINGS,
  type AppSettings,
  type EstimateSettings,
  type SettingsHistoryEntry,
  type SettingsVersion,
} from '#shared/schemas/settings'
import { fetchSettings, fetchSettingsHistory, fetchSettingsVersion, saveSettings } from '@/api/settings'
import { loadSettingsCopy, saveSettingsCopy } from '@/db/meta'

// Device-wide, outside any one store instance: the live estimate, the device's copies of saved exams and new drafts
// are computed in plain modules that read these; the store below is how the app loads and changes them.
const inUse = ref<SettingsVersion | null>(null)
const olderVersions = ref<Record<number, AppSettings>>({})

/** The estimate's thresholds and error terms this device uses now: the server's, its kept copy, or the defaults. */
export function estimateSettingsInUse(): EstimateSettings {
  return inUse.value?.values.estimate ?? DEFAULT_ESTIMATE_SETTINGS
}

/** The version of the settings in use; undefined while this device has never received any (it then uses the defaults). */
export function settingsVersionInUse(): number | undefined {
  return inUse.value?.version
}

/** The offset model a new exam starts with. */
export function defaultOffsetModelInUse(): OffsetModel {
  return inUse.value?.values.defaultOffsetModel ?? DEFAULT_APP_SETTINGS.defaultOffsetModel
}

/** The estimate settings of a given version when this device knows them, else those in use. */
export function estimateSettingsFor(version: number | undefined): EstimateSettings {
  return (version !== undefined && olderVersions.value[version]?.estimate) || estimateSettingsInUse()
}

/** Fetches an older version once, so a past estimate's comparisons use the values it was computed with. */
export async function ensureSettingsVersion(version: number | undefined): Promise<void> {
  // Nothing to ask while this device has received no settings (signed out, never online): the defaults apply.
  if (version === undefined || !inUse.value || version === inUse.value.version || olderVersions.value[version]) return
  const fetched = await fetchSettingsVersion(version).catch(() => null)
  if (fetched) olderVersions.value = { ...olderVersions.value, [version]: fetched.values }
}

export const useSettingsStore = defineStore('settings', () => {
  /** The settings in force as this device last received them; null until then. */
  const current = inUse
  /** Where `current` came from: the server now, or the copy kept on this device (offline). */
  const source = ref<'server' | 'device' | null>(null)
  /** The admin's list of recent versions, newest first. */
  const history = ref<SettingsHistoryEntry[]>([])

  function keep(settings: SettingsVersion) {
    inUse.value = settings
    olderVersions.value = { ...olderVersions.value, [settings.version]: settings.values }
  }

  /** After sign-in: the device's copy at once, then the server's, which is kept for offline use. */
  async function load() {
    if (!inUse.value) {
      const kept = await loadSettingsCopy().catch(() => null)
      if (kept && !inUse.value) {
        keep(kept)
        source.value = 'device'
      }
    }
    const fresh = await fetchSettings().catch(() => null)
    if (!fresh) return
    keep(fresh)
    source.value = 'server'
    await saveSettingsCopy(fresh).catch(() => undefined)
  }

  /** Reads the current settings from the server, failing loudly (the admin screen shows the error). */
  async function refresh() {
    keep(await fetchSettings())
    source.value = 'server'
  }

  async function loadHistory() {
    history.value = await fetchSettingsHistory()
  }

  /** Saves the admin's values; 'stale' when someone saved a newer version first, which then becomes `current`. */
  async function save(values: AppSettings): Promise<'saved' | 'stale'> {
    const result = await saveSettings(values, inUse.value?.version ?? 1)
    keep(result.settings)
    await saveSettingsCopy(result.settings).catch(() => undefined)
    return result.kind
  }

  /** Forgets what this device received (for tests and a full sign-out). */
  function forget() {
    inUse.value = null
    olderVersions.value = {}
    source.value = null
    history.value = []
  }

  return { current, source, history, load, refresh, loadHistory, save, forget }
})

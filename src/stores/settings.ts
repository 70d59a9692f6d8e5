import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { ObserverTerm, OffsetModel } from '#shared/schemas/exam'
import { defaultObserverTerm } from '#shared/domain/estimate'
import {
  DEFAULT_APP_SETTINGS,
  DEFAULT_ESTIMATE_SETTINGS,
  type AppSettings,
  type EstimateSettings,
  type SettingsHistoryEntry,
  type SettingsInForce,
  type SettingsVersion,
} from '#shared/schemas/settings'
import { fetchSettings, fetchSettingsHistory, fetchSettingsVersion, saveSettings } from '@/api/settings'
import type { EstimateBasis } from '@/db/local-exams'
import { loadSettingsCopy, loadSettingsVersionCopy, saveSettingsCopy, saveSettingsVersionCopy } from '@/db/meta'

// Device-wide, outside any one store instance: the live estimate, the device's copies of saved exams and new drafts
// are computed in plain modules that read these; the store below is how the app loads and changes them.
const inUse = ref<SettingsInForce | null>(null)
const olderVersions = ref<Record<number, AppSettings>>({})

/** The estimate's thresholds and error terms this device uses now: the server's, its kept copy, or the defaults. */
export function estimateSettingsInUse(): EstimateSettings {
  return inUse.value?.values.estimate ?? DEFAULT_ESTIMATE_SETTINGS
}

/**
 * The error term the server estimates with now (the default or a local one), so the band reviewed on this device is
 * the band the server stores; the default term of the settings in use until the server has sent one.
 */
export function observerTermInUse(): ObserverTerm {
  return inUse.value?.observerTerm ?? defaultObserverTerm(estimateSettingsInUse())
}

/** The version of the settings in use; undefined while this device has never received any (it then uses the defaults). */
export function settingsVersionInUse(): number | undefined {
  return inUse.value?.version
}

/** What this device estimates with now, as `src/db` takes it: settings, error term and version in use. */
export function estimateBasisInUse(): EstimateBasis {
  return { settings: estimateSettingsInUse(), observer: observerTermInUse(), settingsVersion: settingsVersionInUse() }
}

/** The offset model a new exam starts with. */
export function defaultOffsetModelInUse(): OffsetModel {
  return inUse.value?.values.defaultOffsetModel ?? DEFAULT_APP_SETTINGS.defaultOffsetModel
}

/**
 * The settings of a given version when this device knows them exactly, else undefined (never those of another
 * version: a past estimate must not be labelled with limits it was not judged by). Version 1 is the defaults.
 */
export function settingsOfVersion(version: number): AppSettings | undefined {
  if (inUse.value?.version === version) return inUse.value.values
  // The server seeds version 1 with the defaults (migration 2026.12.07T11.00.00.settings), so it needs no fetch.
  return olderVersions.value[version] ?? (version === 1 ? DEFAULT_APP_SETTINGS : undefined)
}

/** The estimate settings of a given version when this device knows them exactly, else undefined. */
export function estimateSettingsFor(version: number): EstimateSettings | undefined {
  return settingsOfVersion(version)?.estimate
}

const pending = new Map<number, Promise<void>>()

/**
 * Makes a past version known on this device: from the copy kept on the device, else from the server (then kept on
 * the device for offline use). Failing quietly: the version then stays unknown and screens show no limits.
 */
export function ensureSettingsVersion(version: number | undefined): Promise<void> {
  if (version === undefined || settingsOfVersion(version)) return Promise.resolve()
  const running = pending.get(version)
  if (running) return running
  const done = (async () => {
    const kept = await loadSettingsVersionCopy(version).catch(() => null)
    if (kept) return remember(kept)
    // Nothing to ask while this device has received no settings (signed out, never online).
    if (!inUse.value) return
    const fetched = await Promise.resolve()
      .then(() => fetchSettingsVersion(version))
      .catch(() => null)
    if (!fetched || fetched.version !== version) return
    remember(fetched)
    await saveSettingsVersionCopy(fetched).catch(() => undefined)
  })().finally(() => pending.delete(version))
  pending.set(version, done)
  return done
}

function remember(settings: SettingsVersion) {
  olderVersions.value = { ...olderVersions.value, [settings.version]: settings.values }
}

export const useSettingsStore = defineStore('settings', () => {
  /** The settings in force as this device last received them; null until then. */
  const current = inUse
  /** Where `current` came from: the server now, or the copy kept on this device (offline). */
  const source = ref<'server' | 'device' | null>(null)
  /** The admin's list of recent versions, newest first. */
  const history = ref<SettingsHistoryEntry[]>([])

  function keep(settings: SettingsInForce) {
    inUse.value = settings
    remember(settings)
  }

  /**
   * An admin's save answers with the new version: a local term stays (it rests on exams, not on these values), a
   * default one follows the new default observer error, unless the answer carries the term itself.
   */
  function keepSaved(settings: SettingsVersion & { observerTerm?: ObserverTerm }): SettingsInForce {
    const earlier = inUse.value?.observerTerm
    const local = earlier && earlier.source !== 'default' ? earlier : undefined
    const inForce = { ...settings, observerTerm: settings.observerTerm ?? local ?? defaultObserverTerm(settings.values.estimate) }
    keep(inForce)
    return inForce
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
    await saveSettingsCopy(keepSaved(result.settings)).catch(() => undefined)
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

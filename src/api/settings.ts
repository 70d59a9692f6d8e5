import { isHTTPError } from 'ky'
import type { z } from 'zod'
import {
  SettingsHistorySchema,
  SettingsVersionSchema,
  type AppSettings,
  type SettingsInForce,
} from '#shared/schemas/settings'
import { ObserverTermSchema } from '#shared/schemas/exam'
import { defaultObserverTerm } from '#shared/domain/estimate'
import { api } from './client'

// A save answers with the new version, and with the error term in force when the server sends it along.
const SavedSettingsSchema = SettingsVersionSchema.extend({ observerTerm: ObserverTermSchema.optional() })
type SavedSettings = z.infer<typeof SavedSettingsSchema>

/**
 * The settings in force with the error term the server estimates with, for any signed-in user. A server from before
 * local error terms sends none: it estimates with the default term of its settings.
 */
export async function fetchSettings(): Promise<SettingsInForce> {
  const settings = SavedSettingsSchema.parse(await api.get('settings').json())
  return { ...settings, observerTerm: settings.observerTerm ?? defaultObserverTerm(settings.values.estimate) }
}

/** An older version by number, to show what a past estimate was computed with. */
export function fetchSettingsVersion(version: number) {
  return api.get(`settings/versions/${version}`).json().then((body) => SettingsVersionSchema.parse(body))
}

export function fetchSettingsHistory() {
  return api.get('admin/settings/history').json().then((body) => SettingsHistorySchema.parse(body).versions)
}

export type SaveSettingsResult = { kind: 'saved'; settings: SavedSettings } | { kind: 'stale'; settings: SavedSettings }

/**
 * Saves every setting as a new version based on `baseVersion`. Someone else's newer save answers `stale` with it;
 * any other refusal (field errors, 403) is thrown for `readApiError`.
 */
export async function saveSettings(values: AppSettings, baseVersion: number): Promise<SaveSettingsResult> {
  try {
    const body = await api.put('admin/settings', { json: { ...values, baseVersion } }).json()
    return { kind: 'saved', settings: SavedSettingsSchema.parse(body) }
  } catch (e) {
    if (!isHTTPError(e) || e.response.status !== 409) throw e
    const body = (await e.response.clone().json()) as { settings?: unknown }
    return { kind: 'stale', settings: SavedSettingsSchema.parse(body.settings) }
  }
}

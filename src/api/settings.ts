import { isHTTPError } from 'ky'
import {
  SettingsHistorySchema,
  SettingsVersionSchema,
  type AppSettings,
  type SettingsVersion,
} from '#shared/schemas/settings'
import { api } from './client'

/** The settings in force, for any signed-in user. */
export function fetchSettings() {
  return api.get('settings').json().then((body) => SettingsVersionSchema.parse(body))
}

/** An older version by number, to show what a past estimate was computed with. */
export function fetchSettingsVersion(version: number) {
  return api.get(`settings/versions/${version}`).json().then((body) => SettingsVersionSchema.parse(body))
}

export function fetchSettingsHistory() {
  return api.get('admin/settings/history').json().then((body) => SettingsHistorySchema.parse(body).versions)
}

export type SaveSettingsResult = { kind: 'saved'; settings: SettingsVersion } | { kind: 'stale'; settings: SettingsVersion }

/**
 * Saves every setting as a new version based on `baseVersion`. Someone else's newer save answers `stale` with it;
 * any other refusal (field errors, 403) is thrown for `readApiError`.
 */
export async function saveSettings(values: AppSettings, baseVersion: number): Promise<SaveSettingsResult> {
  try {
    const body = await api.put('admin/settings', { json: { ...values, baseVersion } }).json()
    return { kind: 'saved', settings: SettingsVersionSchema.parse(body) }
  } catch (e) {
    if (!isHTTPError(e) || e.response.status !== 409) throw e
    const body = (await e.response.clone().json()) as { settings?: unknown }
    return { kind: 'stale', settings: SettingsVersionSchema.parse(body.settings) }
  }
}

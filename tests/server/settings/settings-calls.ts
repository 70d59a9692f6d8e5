import request from 'supertest'
import { DEFAULT_APP_SETTINGS, type AppSettings } from '#shared/schemas/settings'

type App = Parameters<typeof request>[0]

export interface SettingsChangeInput {
  estimate?: Partial<AppSettings['estimate']>
  pairWindowMinutes?: number
  defaultOffsetModel?: AppSettings['defaultOffsetModel']
  photosAllowed?: boolean
}

/** The defaults with some values changed: a whole settings body as the admin screen sends it. */
export function settingsWith(change: SettingsChangeInput = {}): AppSettings {
  return { ...DEFAULT_APP_SETTINGS, ...change, estimate: { ...DEFAULT_APP_SETTINGS.estimate, ...change.estimate } }
}

export function putSettings(app: App, auth: string, body: unknown) {
  return request(app).put('/api/admin/settings').set('Authorization', auth).send(body as object)
}

/** Saves a change on top of the version in force and fails loudly if the server refuses it. */
export async function saveSettings(app: App, adminAuth: string, change: SettingsChangeInput) {
  const current = await request(app).get('/api/settings').set('Authorization', adminAuth)
  const res = await putSettings(app, adminAuth, { ...settingsWith(change), baseVersion: current.body.version })
  if (res.status !== 200) throw new Error(`saveSettings: ${res.status} ${JSON.stringify(res.body)}`)
  return res.body as { version: number; values: AppSettings }
}

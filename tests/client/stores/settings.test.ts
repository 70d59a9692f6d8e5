import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { DEFAULT_APP_SETTINGS, type AppSettings, type SettingsVersion } from '#shared/schemas/settings'
import { liveEstimate, parseDraft } from '@/components/bedside/bedside-steps'
import { db } from '@/db'
import { newDraft } from '@/db/draft-schema'
import { localExamOf } from '@/db/local-exams'
import { loadSettingsCopy, loadSettingsVersionCopy } from '@/db/meta'
import { estimateSettingsFor, ensureSettingsVersion, useSettingsStore } from '@/stores/settings'
import * as api from '@/api/settings'
import { makeDraft, WORKED_EXAMPLE } from '../factories/draft'
import { makeUser } from '../factories/user'

vi.mock('@/api/settings')

function version(version: number, change: Partial<Omit<AppSettings, 'estimate'>> & { estimate?: Partial<AppSettings['estimate']> } = {}): SettingsVersion {
  const values = { ...DEFAULT_APP_SETTINGS, ...change, estimate: { ...DEFAULT_APP_SETTINGS.estimate, ...change.estimate } }
  return { version, values, changedAt: '2026-12-07T11:00:00.000Z' }
}

// Raised thresholds (elevated > 5 cm, high > 15 cmH₂O) turn §4's worked example (h = 4 cm, 13.7 cmH₂O) from
// elevated and high into not elevated and normal.
const RAISED = version(2, { estimate: { elevatedAboveCm: 5, highAboveCmH2O: 15 }, defaultOffsetModel: 'fixed-5cm' })

const offline = () => Promise.reject(new TypeError('Failed to fetch'))

describe('settings store', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    useSettingsStore().forget()
    await db.meta.clear()
    vi.mocked(api.fetchSettings).mockReset()
    vi.mocked(api.fetchSettingsVersion).mockReset()
    vi.mocked(api.saveSettings).mockReset()
  })

  it('loads the server\'s settings after sign-in and keeps a copy on the device', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)
    const store = useSettingsStore()

    await store.load()

    expect(store.current).toEqual(RAISED)
    expect(store.source).toBe('server')
    expect(await loadSettingsCopy()).toEqual(RAISED)
  })

  it('offline, uses the copy kept on the device', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)
    await useSettingsStore().load()
    useSettingsStore().forget()
    vi.mocked(api.fetchSettings).mockImplementation(offline)

    await useSettingsStore().load()

    expect(useSettingsStore().current?.version).toBe(2)
    expect(useSettingsStore().source).toBe('device')
  })

  it('with nothing received yet, the live estimate uses the cited defaults', () => {
    const estimate = liveEstimate(makeDraft(WORKED_EXAMPLE))

    // McGee 1998: elevated above 3 cm; Cook 1990 categories: high above 10 cmH₂O.
    expect(estimate).toMatchObject({ elevated: true, category: 'high' })
  })

  it('the live estimate and the device copy of a saved exam use the settings in force', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)
    await useSettingsStore().load()
    const draft = makeDraft(WORKED_EXAMPLE)

    const live = liveEstimate(draft)
    const copy = localExamOf(parseDraft(draft)!, makeUser())

    expect(live).toMatchObject({ elevated: false, category: 'normal' })
    expect(copy.estimate).toMatchObject({ elevated: false, category: 'normal', settingsVersion: 2 })
  })

  it('a new draft starts with the default offset model of the settings', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)

    const before = newDraft([]).fields.offsetModel
    await useSettingsStore().load()
    const after = newDraft([]).fields.offsetModel

    expect(before).toBe('incline-adjusted')
    expect(after).toBe('fixed-5cm')
  })

  it('fetches an older version once to read a past estimate with its own thresholds, and keeps it on the device', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3))
    vi.mocked(api.fetchSettingsVersion).mockResolvedValue(RAISED)
    await useSettingsStore().load()

    await Promise.all([ensureSettingsVersion(2), ensureSettingsVersion(2)])
    await ensureSettingsVersion(2)

    expect(api.fetchSettingsVersion).toHaveBeenCalledTimes(1)
    expect(estimateSettingsFor(2)?.highAboveCmH2O).toBe(15)
    expect(estimateSettingsFor(3)?.highAboveCmH2O).toBe(10)
    expect(await loadSettingsVersionCopy(2)).toEqual(RAISED)
  })

  it('offline, a version fetched before comes from the device', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3))
    vi.mocked(api.fetchSettingsVersion).mockResolvedValue(RAISED)
    await useSettingsStore().load()
    await ensureSettingsVersion(2)
    useSettingsStore().forget()
    vi.mocked(api.fetchSettings).mockImplementation(offline)
    vi.mocked(api.fetchSettingsVersion).mockReset().mockImplementation(offline)

    await useSettingsStore().load()
    await ensureSettingsVersion(2)

    expect(api.fetchSettingsVersion).not.toHaveBeenCalled()
    expect(estimateSettingsFor(2)?.highAboveCmH2O).toBe(15)
  })

  it('a version once in force is kept on the device by number, for past estimates after it is replaced', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)
    await useSettingsStore().load()
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3))
    await useSettingsStore().load()

    expect(await loadSettingsVersionCopy(2)).toEqual(RAISED)
    expect(await loadSettingsCopy()).toEqual(version(3))
  })

  it('a version not known on this device is undefined, never the settings in force, also when the fetch fails', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)
    vi.mocked(api.fetchSettingsVersion).mockImplementation(offline)
    await useSettingsStore().load()

    await ensureSettingsVersion(4)

    expect(api.fetchSettingsVersion).toHaveBeenCalledWith(4)
    expect(estimateSettingsFor(4)).toBeUndefined()
  })

  it('version 1 is the defaults, known without a fetch', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)
    await useSettingsStore().load()

    await ensureSettingsVersion(1)

    expect(api.fetchSettingsVersion).not.toHaveBeenCalled()
    // McGee 1998: elevated above 3 cm; Cook 1990 categories: high above 10 cmH₂O.
    expect(estimateSettingsFor(1)).toMatchObject({ elevatedAboveCm: 3, highAboveCmH2O: 10 })
  })

  it('a save answered as stale takes the newer version as current', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(version(1))
    const store = useSettingsStore()
    await store.load()
    vi.mocked(api.saveSettings).mockResolvedValue({ kind: 'stale', settings: RAISED })

    const outcome = await store.save({ ...DEFAULT_APP_SETTINGS, pairWindowMinutes: 90 })

    expect(outcome).toBe('stale')
    expect(api.saveSettings).toHaveBeenCalledWith({ ...DEFAULT_APP_SETTINGS, pairWindowMinutes: 90 }, 1)
    expect(store.current).toEqual(RAISED)
  })
})

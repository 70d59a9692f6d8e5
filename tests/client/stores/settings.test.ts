import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { DEFAULT_APP_SETTINGS, type AppSettings, type SettingsInForce } from '#shared/schemas/settings'
import type { ObserverTerm } from '#shared/schemas/exam'
import { liveEstimate, parseDraft } from '@/utils/bedside-steps'
import { db } from '@/db'
import { localExamOf } from '@/db/local-exams'
import { loadSettingsCopy, loadSettingsVersionCopy } from '@/db/meta'
import { estimateBasisInUse, estimateSettingsFor, ensureSettingsVersion, useSettingsStore } from '@/stores/settings'
import { useExamDraftStore } from '@/stores/exam-draft'
import * as api from '@/api/settings'
import { makeDraft, WORKED_EXAMPLE } from '../factories/draft'
import { makeUser } from '../factories/user'

vi.mock('@/api/settings')

type Change = Partial<Omit<AppSettings, 'estimate'>> & { estimate?: Partial<AppSettings['estimate']> }

function version(version: number, change: Change = {}, observerTerm?: ObserverTerm): SettingsInForce {
  const values = { ...DEFAULT_APP_SETTINGS, ...change, estimate: { ...DEFAULT_APP_SETTINGS.estimate, ...change.estimate } }
  const term = observerTerm ?? { source: 'default' as const, sigmaCm: values.estimate.sigmaObserverCm, n: null, ci: null }
  return { version, values, changedAt: '2026-12-07T11:00:00.000Z', observerTerm: term }
}

// Raised thresholds (elevated > 5 cm, high > 15 cmH₂O) turn the worked example (h = 4 cm at 45°, 13.7 cmH₂O) from
// elevated into not elevated (McGee 1998's rule with the setting's 5 cm).
const RAISED = version(2, { estimate: { elevatedAboveCm: 5, highAboveCmH2O: 15 }, defaultOffsetModel: 'fixed-5cm' })

// A local term from 40 routine pairs: σ_exam 1.2 cm replaces σ_read and σ_observer, so the worked example's σ is
// √(1.2² + 1.0²) = 1.562 cm (Seth 2002 offset error 1.0 cm) and its band 13.7 ± 1.96·1.562 = 10.6–16.8 cmH₂O.
const LOCAL_TERM: ObserverTerm = { source: 'local-pairs', sigmaCm: 1.2, n: 40, ci: [0.98, 1.55] }

/** A version as kept by number for past estimates: the values, without the error term in force. */
function kept({ observerTerm: _term, ...settings }: SettingsInForce) {
  return settings
}

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
    const estimate = liveEstimate(makeDraft(WORKED_EXAMPLE), estimateBasisInUse())

    // McGee 1998: elevated above 3 cm; Cook 1990 categories: the band 9.2–18.2 reaches normal (5–10) and high (> 10).
    expect(estimate).toMatchObject({ elevated: true, categories: ['normal', 'high'], observerSource: 'default' })
  })

  it('the live estimate and the device copy of a saved exam use the settings in force', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)
    await useSettingsStore().load()
    const draft = makeDraft({ ...WORKED_EXAMPLE, offsetModel: 'incline-adjusted' })

    const live = liveEstimate(draft, estimateBasisInUse())
    const copy = localExamOf(parseDraft(draft)!, makeUser(), estimateBasisInUse())

    expect(live).toMatchObject({ elevated: false, settingsVersion: 2 })
    expect(copy.estimate).toMatchObject({ elevated: false, settingsVersion: 2 })
  })

  it('the live estimate and the device copy use the error term the server sent, so the band reviewed is the band stored', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3, {}, LOCAL_TERM))
    await useSettingsStore().load()
    const draft = makeDraft(WORKED_EXAMPLE)

    const live = liveEstimate(draft, estimateBasisInUse())!
    const copy = localExamOf(parseDraft(draft)!, makeUser(), estimateBasisInUse())

    expect(live.observerSource).toBe('local-pairs')
    expect(live.bandCmH2O![0]).toBeCloseTo(13.7 - 1.96 * Math.hypot(1.2, 1.0), 5)
    expect(live.bandCmH2O![1]).toBeCloseTo(13.7 + 1.96 * Math.hypot(1.2, 1.0), 5)
    expect(copy.estimate.bandCmH2O).toEqual(live.bandCmH2O)
    expect(copy.estimate.observerN).toBe(40)
  })

  it('offline, keeps the error term with the settings on the device', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3, {}, LOCAL_TERM))
    await useSettingsStore().load()
    useSettingsStore().forget()
    vi.mocked(api.fetchSettings).mockImplementation(offline)

    await useSettingsStore().load()

    expect(useSettingsStore().current?.observerTerm).toEqual(LOCAL_TERM)
    expect(liveEstimate(makeDraft(WORKED_EXAMPLE), estimateBasisInUse())?.observerSource).toBe('local-pairs')
  })

  it('a copy kept by the previous app version, without an error term, reads as the default term of its settings', async () => {
    const { observerTerm: _term, ...older } = version(2, { estimate: { sigmaObserverCm: 2.5 } })
    await db.meta.put({ key: 'settings', value: older })
    vi.mocked(api.fetchSettings).mockImplementation(offline)

    await useSettingsStore().load()

    expect(useSettingsStore().current?.observerTerm).toEqual({ source: 'default', sigmaCm: 2.5, n: null, ci: null })
  })

  it('a new draft starts with the default offset model of the settings', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(RAISED)

    const drafts = useExamDraftStore()
    await drafts.startNew([])
    const before = drafts.draft?.fields.offsetModel
    await useSettingsStore().load()
    await drafts.startNew([])
    const after = drafts.draft?.fields.offsetModel

    expect(before).toBe('incline-adjusted')
    expect(after).toBe('fixed-5cm')
  })

  it('fetches an older version once to read a past estimate with its own thresholds, and keeps it on the device', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3))
    vi.mocked(api.fetchSettingsVersion).mockResolvedValue(kept(RAISED))
    await useSettingsStore().load()

    await Promise.all([ensureSettingsVersion(2), ensureSettingsVersion(2)])
    await ensureSettingsVersion(2)

    expect(api.fetchSettingsVersion).toHaveBeenCalledTimes(1)
    expect(estimateSettingsFor(2)?.highAboveCmH2O).toBe(15)
    expect(estimateSettingsFor(3)?.highAboveCmH2O).toBe(10)
    expect(await loadSettingsVersionCopy(2)).toEqual(kept(RAISED))
  })

  it('offline, a version fetched before comes from the device', async () => {
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3))
    vi.mocked(api.fetchSettingsVersion).mockResolvedValue(kept(RAISED))
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

    expect(await loadSettingsVersionCopy(2)).toEqual(kept(RAISED))
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

  it('after an admin saves, a local error term stays and a default one follows the new default observer error', async () => {
    const { observerTerm: _term, ...saved } = version(4, { estimate: { sigmaObserverCm: 3 } })
    vi.mocked(api.saveSettings).mockResolvedValue({ kind: 'saved', settings: saved })
    const store = useSettingsStore()
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3, {}, LOCAL_TERM))
    await store.load()

    await store.save(saved.values)
    const local = store.current?.observerTerm
    store.forget()
    vi.mocked(api.fetchSettings).mockResolvedValue(version(3))
    await store.load()
    await store.save(saved.values)

    expect(local).toEqual(LOCAL_TERM)
    expect(store.current?.observerTerm).toEqual({ source: 'default', sigmaCm: 3, n: null, ci: null })
  })
})

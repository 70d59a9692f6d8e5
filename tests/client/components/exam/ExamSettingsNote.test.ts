import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import { computeEstimate } from '#shared/domain/estimate'
import type { Estimate } from '#shared/schemas/exam'
import { DEFAULT_APP_SETTINGS, type AppSettings, type SettingsInForce } from '#shared/schemas/settings'
import ExamResultCard from '@/components/exam/ExamResultCard.vue'
import ExamSettingsNote from '@/components/exam/ExamSettingsNote.vue'
import { db } from '@/db'
import { useSettingsStore } from '@/stores/settings'
import * as api from '@/api/settings'
import { makeFindings } from '../../factories/draft'

vi.mock('@/api/settings')

type Change = Partial<Omit<AppSettings, 'estimate'>> & { estimate?: Partial<AppSettings['estimate']> }

function version(n: number, change: Change = {}): SettingsInForce {
  const values = { ...DEFAULT_APP_SETTINGS, ...change, estimate: { ...DEFAULT_APP_SETTINGS.estimate, ...change.estimate } }
  const observerTerm = { source: 'default' as const, sigmaCm: values.estimate.sigmaObserverCm, n: null, ci: null }
  return { version: n, values, changedAt: '2026-12-07T11:00:00.000Z', observerTerm }
}

const offline = () => Promise.reject(new TypeError('Failed to fetch'))

/** A past version as the server sends it by number: without the error term in force. */
function kept({ observerTerm: _term, ...settings }: SettingsInForce) {
  return settings
}

// The worked example as the server stored it under version 1 (the defaults): 13.7 cmH₂O, band 9.2–18.2, so normal
// (5–10) or high (> 10) by Cook 1990's categories, and elevated by McGee 1998's 3 cm.
const findings = makeFindings()
const storedUnderVersion1 = { ...computeEstimate(findings), settingsVersion: 1 }

// The same exam judged under a version 2 with high above 12 cmH₂O (an admin's choice in these tests, no source):
// the band still reaches normal and high.
const VERSION_2 = version(2, { estimate: { highAboveCmH2O: 12 } })
const storedUnderVersion2 = { ...computeEstimate(findings, { settings: VERSION_2.values.estimate }), settingsVersion: 2 }

async function inForce(settings: SettingsInForce) {
  vi.mocked(api.fetchSettings).mockResolvedValue(settings)
  await useSettingsStore().load()
}

const vuetify = createVuetify()
const mountNote = (estimate: Estimate) => mount(ExamSettingsNote, { props: { estimate }, global: { plugins: [vuetify] } })
const mountCard = (estimate?: Estimate) => mount(ExamResultCard, { props: { findings, estimate }, global: { plugins: [vuetify] } })

beforeEach(async () => {
  setActivePinia(createPinia())
  useSettingsStore().forget()
  await db.meta.clear()
  vi.mocked(api.fetchSettings).mockReset()
  vi.mocked(api.fetchSettingsVersion).mockReset().mockImplementation(offline)
})

describe('ExamSettingsNote', () => {
  it('says which settings version the estimate was computed with', async () => {
    await inForce(version(1))

    const wrapper = mountNote(storedUnderVersion1)

    expect(wrapper.text()).toBe('Computed with settings version 1.')
    expect(wrapper.find('[data-testid="exam-settings-changed"]').exists()).toBe(false)
  })

  it('when a threshold changed since, warns and names it', async () => {
    await inForce(version(2, { estimate: { highAboveCmH2O: 15 } }))

    const wrapper = mountNote(storedUnderVersion1)
    await flushPromises()

    const warning = wrapper.find('[data-testid="exam-settings-changed"]')
    expect(warning.classes()).toContain('text-warning')
    expect(warning.text()).toBe('The high-CVP threshold has changed since (now version 2); this estimate keeps the values it was computed with.')
  })

  it('names each kind of estimate setting that changed, error terms as the error band', async () => {
    await inForce(version(3, { estimate: { lowBelowCmH2O: 6, highAboveCmH2O: 15, sigmaObserverCm: 2.5, sigmaOffsetCm: 1.2 } }))

    const wrapper = mountNote(storedUnderVersion1)
    await flushPromises()

    expect(wrapper.find('[data-testid="exam-settings-changed"]').text()).toContain('The low-CVP threshold, high-CVP threshold and error band have changed since (now version 3)')
  })

  it('no warning when a newer version changed only photos, the pairing window or the default model', async () => {
    await inForce(version(2, { photosAllowed: true, pairWindowMinutes: 60, defaultOffsetModel: 'fixed-5cm' }))

    const wrapper = mountNote(storedUnderVersion1)
    await flushPromises()

    expect(wrapper.text()).toBe('Computed with settings version 1.')
    expect(wrapper.find('[data-testid="exam-settings-changed"]').exists()).toBe(false)
    expect(api.fetchSettingsVersion).not.toHaveBeenCalled()
  })

  it('fetches the estimate\'s own version to compare, and warns only once it knows the thresholds differ', async () => {
    await inForce(version(3, { estimate: { highAboveCmH2O: 12 }, photosAllowed: true }))
    vi.mocked(api.fetchSettingsVersion).mockResolvedValue(kept(VERSION_2))

    const wrapper = mountNote(storedUnderVersion2)
    await flushPromises()

    // Version 2 and 3 share every estimate setting: no warning.
    expect(api.fetchSettingsVersion).toHaveBeenCalledWith(2)
    expect(wrapper.text()).toBe('Computed with settings version 2.')
  })

  it('when the estimate\'s version cannot be had (offline), says so neutrally, without a warning', async () => {
    await inForce(version(3, { estimate: { highAboveCmH2O: 15 } }))

    const wrapper = mountNote(storedUnderVersion2)
    await flushPromises()

    expect(api.fetchSettingsVersion).toHaveBeenCalledWith(2)
    expect(wrapper.find('[data-testid="exam-settings-changed"]').exists()).toBe(false)
    const note = wrapper.find('[data-testid="exam-settings-changed-unknown"]')
    expect(note.text()).toBe('Settings have changed since (now version 3); the figures are as computed then.')
    expect(note.classes()).not.toContain('text-warning')
  })

  it('an estimate stored before versioned settings counts as version 1, the defaults', async () => {
    await inForce(version(1))
    const { settingsVersion: _none, ...unversioned } = storedUnderVersion1

    const wrapper = mountNote(unversioned)

    expect(wrapper.text()).toBe('Computed with settings version 1.')
  })
})

describe('ExamResultCard with a saved estimate after the settings changed', () => {
  it('keeps the stored categories with the limits of version 1, the defaults, without asking the server', async () => {
    await inForce(version(2, { estimate: { lowBelowCmH2O: 6, highAboveCmH2O: 15, elevatedAboveCm: 5 } }))

    const wrapper = mountCard(storedUnderVersion1)
    await flushPromises()

    expect(api.fetchSettingsVersion).not.toHaveBeenCalled()
    expect(wrapper.find('[data-testid="exam-category"]').text()).toContain('normal or high')
    expect(wrapper.find('[data-testid="exam-category-limits"]').text()).toBe('(normal 5–10, high > 10 cmH₂O)')
    expect(wrapper.find('[data-testid="exam-elevated"]').text()).toBe('JVP elevated (more than 3 cm above the sternal angle)')
    expect(wrapper.find('[data-testid="exam-settings-note"]').text()).toContain('Computed with settings version 1.')
  })

  it('when the estimate\'s own version is unknown on this device, shows the stored statements without limits', async () => {
    // Under version 3 (elevated above 5 cm) 4 cm would not be elevated: its limits must not label the stored answer.
    await inForce(version(3, { estimate: { lowBelowCmH2O: 6, highAboveCmH2O: 15, elevatedAboveCm: 5 } }))

    const wrapper = mountCard(storedUnderVersion2)
    await flushPromises()

    expect(wrapper.find('[data-testid="exam-category"]').text()).toContain('normal or high')
    expect(wrapper.find('[data-testid="exam-category-limits"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="exam-elevated"]').text()).toBe('JVP elevated')
    expect(wrapper.find('[data-testid="exam-settings-changed-unknown"]').exists()).toBe(true)
  })

  it('shows the limits once the version is fetched, and from the device copy when offline later', async () => {
    await inForce(version(3, { estimate: { lowBelowCmH2O: 6, highAboveCmH2O: 15 } }))
    vi.mocked(api.fetchSettingsVersion).mockResolvedValue(kept(VERSION_2))

    const online = mountCard(storedUnderVersion2)
    await flushPromises()
    expect(online.find('[data-testid="exam-category-limits"]').text()).toBe('(normal 5–12, high > 12 cmH₂O)')
    expect(online.find('[data-testid="exam-settings-changed"]').text()).toContain('The low-CVP threshold and high-CVP threshold have changed')

    // A fresh start of the app, offline: the settings in force and version 2 come from the device.
    useSettingsStore().forget()
    vi.mocked(api.fetchSettings).mockImplementation(offline)
    vi.mocked(api.fetchSettingsVersion).mockReset().mockImplementation(offline)
    await useSettingsStore().load()
    const later = mountCard(storedUnderVersion2)
    await flushPromises()

    expect(api.fetchSettingsVersion).not.toHaveBeenCalled()
    expect(later.find('[data-testid="exam-category-limits"]').text()).toBe('(normal 5–12, high > 12 cmH₂O)')
  })

  it('a live estimate uses the limits in force', async () => {
    await inForce(version(2, { estimate: { lowBelowCmH2O: 6, highAboveCmH2O: 15 } }))

    const wrapper = mountCard()

    // The band 9.2–18.2 reaches normal (6–15) and high (> 15) under version 2.
    expect(wrapper.find('[data-testid="exam-category-limits"]').text()).toBe('(normal 6–15, high > 15 cmH₂O)')
    expect(wrapper.find('[data-testid="exam-settings-note"]').exists()).toBe(false)
  })
})

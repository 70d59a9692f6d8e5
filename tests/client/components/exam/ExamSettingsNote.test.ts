import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import { computeEstimate } from '#shared/domain/estimate'
import { DEFAULT_APP_SETTINGS, type AppSettings, type SettingsVersion } from '#shared/schemas/settings'
import ExamResultCard from '@/components/exam/ExamResultCard.vue'
import ExamSettingsNote from '@/components/exam/ExamSettingsNote.vue'
import { db } from '@/db'
import { useSettingsStore } from '@/stores/settings'
import * as api from '@/api/settings'
import { makeFindings } from '../../factories/draft'

vi.mock('@/api/settings')

function version(n: number, estimate: Partial<AppSettings['estimate']> = {}): SettingsVersion {
  return { version: n, values: { ...DEFAULT_APP_SETTINGS, estimate: { ...DEFAULT_APP_SETTINGS.estimate, ...estimate } }, changedAt: '2026-12-07T11:00:00.000Z' }
}

// §4's worked example as the server stored it under version 1 (the defaults): 13.7 cmH₂O, high (> 10, Cook 1990).
const findings = makeFindings()
const storedUnderVersion1 = { ...computeEstimate(findings), settingsVersion: 1 }

async function inForce(settings: SettingsVersion) {
  vi.mocked(api.fetchSettings).mockResolvedValue(settings)
  await useSettingsStore().load()
}

describe('ExamSettingsNote', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    useSettingsStore().forget()
    await db.meta.clear()
    vi.mocked(api.fetchSettings).mockReset()
    vi.mocked(api.fetchSettingsVersion).mockReset().mockResolvedValue(version(1))
  })

  it('says which settings version the estimate was computed with', async () => {
    await inForce(version(1))

    const wrapper = mount(ExamSettingsNote, { props: { estimate: storedUnderVersion1 }, global: { plugins: [createVuetify()] } })

    expect(wrapper.text()).toBe('Computed with settings version 1.')
    expect(wrapper.find('[data-testid="exam-settings-changed"]').exists()).toBe(false)
  })

  it('when the settings changed since, says the estimate keeps the values it was computed with', async () => {
    await inForce(version(2, { highAboveCmH2O: 15 }))

    const wrapper = mount(ExamSettingsNote, { props: { estimate: storedUnderVersion1 }, global: { plugins: [createVuetify()] } })

    expect(wrapper.find('[data-testid="exam-settings-changed"]').text()).toContain('The thresholds have changed since (now version 2)')
  })

  it('an estimate stored before versioned settings counts as version 1, the defaults', async () => {
    await inForce(version(1))
    const { settingsVersion: _none, ...unversioned } = storedUnderVersion1

    const wrapper = mount(ExamSettingsNote, { props: { estimate: unversioned }, global: { plugins: [createVuetify()] } })

    expect(wrapper.text()).toBe('Computed with settings version 1.')
  })
})

describe('ExamResultCard with a saved estimate after the settings changed', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    useSettingsStore().forget()
    await db.meta.clear()
    vi.mocked(api.fetchSettingsVersion).mockReset().mockResolvedValue(version(1))
  })

  it('keeps the stored category with the limits it was judged by, and shows the note', async () => {
    await inForce(version(2, { lowBelowCmH2O: 6, highAboveCmH2O: 15 }))

    const wrapper = mount(ExamResultCard, { props: { findings, estimate: storedUnderVersion1 }, global: { plugins: [createVuetify()] } })
    await flushPromises()

    expect(api.fetchSettingsVersion).toHaveBeenCalledWith(1)
    expect(wrapper.find('[data-testid="exam-category"]').text()).toBe('High CVP (> 10)')
    expect(wrapper.find('[data-testid="exam-settings-note"]').text()).toContain('Computed with settings version 1.')
  })

  it('a live estimate uses the limits in force', async () => {
    await inForce(version(2, { lowBelowCmH2O: 6, highAboveCmH2O: 15 }))

    const wrapper = mount(ExamResultCard, { props: { findings }, global: { plugins: [createVuetify()] } })

    // 13.7 cmH₂O lies between 6 and 15: normal under version 2.
    expect(wrapper.find('[data-testid="exam-category"]').text()).toBe('Normal CVP (6–15)')
    expect(wrapper.find('[data-testid="exam-settings-note"]').exists()).toBe(false)
  })
})

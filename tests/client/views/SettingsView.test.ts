import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { enableAutoUnmount, flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import { DEFAULT_APP_SETTINGS, type AppSettings, type SettingsHistoryEntry, type SettingsVersion } from '#shared/schemas/settings'
import SettingsView from '@/views/SettingsView.vue'
import { useSettingsStore } from '@/stores/settings'
import * as api from '@/api/settings'
import { httpError } from '../factories/http-error'

vi.mock('@/api/settings')

function version(n: number, change: Partial<AppSettings> = {}): SettingsVersion {
  return { version: n, values: { ...DEFAULT_APP_SETTINGS, ...change }, changedAt: '2026-12-07T11:00:00.000Z' }
}

const FIRST: SettingsHistoryEntry = { ...version(1), changedBy: null, changes: {} }

async function mountSettings() {
  const wrapper = mount(SettingsView, { global: { plugins: [createVuetify()] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

const field = (wrapper: Awaited<ReturnType<typeof mountSettings>>, path: string) => wrapper.find(`[data-testid="setting-${path}"]`)

async function type(wrapper: Awaited<ReturnType<typeof mountSettings>>, path: string, value: string) {
  await field(wrapper, path).find('input').setValue(value)
  await flushPromises()
}

async function saveAndConfirm(wrapper: Awaited<ReturnType<typeof mountSettings>>) {
  await wrapper.find('[data-testid="settings-save"]').trigger('click')
  await flushPromises()
  await vi.waitFor(() => expect(document.querySelector('[data-testid="settings-confirm-save"]')).not.toBeNull(), { timeout: 15_000 })
  ;(document.querySelector('[data-testid="settings-confirm-save"]') as HTMLElement).click()
  await flushPromises()
}

// Mounting Vuetify forms and dialogs takes seconds on a busy machine: the saving tests get room to finish.
describe('SettingsView', { timeout: 30_000 }, () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    useSettingsStore().forget()
    vi.mocked(api.fetchSettings).mockReset().mockResolvedValue({ ...version(1), observerTerm: { source: 'default', sigmaCm: 2, n: null, ci: null } })
    vi.mocked(api.fetchSettingsHistory).mockReset().mockResolvedValue([FIRST])
    vi.mocked(api.saveSettings).mockReset()
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  enableAutoUnmount(afterEach)

  it('shows each threshold with its unit, and its default and source as help', async () => {
    const wrapper = await mountSettings()

    const high = field(wrapper, 'estimate.highAboveCmH2O')
    expect((high.find('input').element as HTMLInputElement).value).toBe('10')
    expect(high.text()).toContain('cmH₂O')
    expect(high.text()).toContain('Default 10 cmH₂O (categories used by Cook 1990)')
    expect(field(wrapper, 'estimate.elevatedAboveCm').text()).toContain('McGee 1998')
    expect(wrapper.find('[data-testid="settings-current"]').text()).toContain('version 1')
  })

  it('a low-CVP threshold above the high one gets an error on the field and cannot be saved', async () => {
    const wrapper = await mountSettings()

    await type(wrapper, 'estimate.lowBelowCmH2O', '12')

    expect(field(wrapper, 'estimate.lowBelowCmH2O').text()).toContain('The low-CVP threshold must be below the high-CVP threshold (10 cmH₂O)')
    expect(wrapper.find('[data-testid="settings-save"]').attributes('disabled')).toBeDefined()
  })

  it('saving asks for confirmation, says the change applies to new estimates only, and sends the base version', async () => {
    vi.mocked(api.saveSettings).mockResolvedValue({ kind: 'saved', settings: version(2, { pairWindowMinutes: 90 }) })
    const wrapper = await mountSettings()
    await type(wrapper, 'pairWindowMinutes', '90')

    await saveAndConfirm(wrapper)

    expect(api.saveSettings).toHaveBeenCalledWith({ ...DEFAULT_APP_SETTINGS, pairWindowMinutes: 90 }, 1)
    await vi.waitFor(() => expect(wrapper.find('[data-testid="settings-notice"]').text()).toContain('Saved as version 2'), { timeout: 15_000 })
    expect(wrapper.find('[data-testid="settings-current"]').text()).toContain('version 2')
  })

  it('a decimal comma typed in a setting reads as a decimal point: "2,5" cm is 2.5, never 25', async () => {
    const wrapper = await mountSettings()
    await type(wrapper, 'estimate.sigmaObserverCm', '2,5')

    await wrapper.find('[data-testid="settings-save"]').trigger('click')

    await vi.waitFor(() => expect(document.querySelector('[data-testid="settings-confirm"]')).not.toBeNull(), { timeout: 15_000 })
    expect(document.querySelector('[data-testid="settings-confirm"]')!.textContent).toContain('2 → 2.5 cm')
  })

  it('the confirmation lists the change and that saved exams keep their estimates', async () => {
    const wrapper = await mountSettings()
    await type(wrapper, 'estimate.highAboveCmH2O', '12')

    await wrapper.find('[data-testid="settings-save"]').trigger('click')

    await vi.waitFor(() => expect(document.querySelector('[data-testid="settings-confirm"]')).not.toBeNull(), { timeout: 15_000 })
    const text = document.querySelector('[data-testid="settings-confirm"]')!.textContent!
    expect(text).toContain('High CVP above: 10 → 12 cmH₂O')
    expect(text).toContain('apply to estimates computed from now on')
    expect(text).toContain('Exams already saved keep the estimate they were computed with')
  })

  it('when someone saved a newer version first, says so and shows that version instead of the edit', async () => {
    vi.mocked(api.saveSettings).mockResolvedValue({ kind: 'stale', settings: version(3, { pairWindowMinutes: 60 }) })
    const wrapper = await mountSettings()
    await type(wrapper, 'pairWindowMinutes', '90')

    await saveAndConfirm(wrapper)

    await vi.waitFor(() => expect(wrapper.find('[data-testid="settings-notice"]').text()).toContain('Someone saved version 3'), { timeout: 15_000 })
    expect((field(wrapper, 'pairWindowMinutes').find('input').element as HTMLInputElement).value).toBe('60')
    expect(wrapper.find('[data-testid="settings-current"]').text()).toContain('version 3')
  })

  it('shows the server\'s field errors under their fields', async () => {
    const fields = { pairWindowMinutes: 'The pairing window is at most 1440 minutes (one day)' }
    vi.mocked(api.saveSettings).mockRejectedValue(httpError(400, 'invalid-input', 'Some fields need attention', fields))
    const wrapper = await mountSettings()
    await type(wrapper, 'pairWindowMinutes', '90')

    await saveAndConfirm(wrapper)

    await vi.waitFor(() => expect(field(wrapper, 'pairWindowMinutes').text()).toContain('at most 1440 minutes'), { timeout: 15_000 })
    expect(wrapper.find('[data-testid="settings-notice"]').text()).toBe('Some fields need attention')
  })

  it('lists recent versions with who saved them and what changed', async () => {
    vi.mocked(api.fetchSettingsHistory).mockResolvedValue([
      { ...version(2, { photosAllowed: true }), changedBy: { id: 'a-1', displayName: 'Morgan Hale' }, changes: { photosAllowed: { from: false, to: true } } },
      FIRST,
    ])

    const wrapper = await mountSettings()

    const entries = wrapper.findAll('[data-testid="settings-version"]').map((e) => e.text())
    expect(entries[0]).toContain('Version 2')
    expect(entries[0]).toContain('Morgan Hale')
    expect(entries[0]).toContain('Photos allowed: no → yes')
    expect(entries[1]).toContain('The defaults the app started with.')
  })
})

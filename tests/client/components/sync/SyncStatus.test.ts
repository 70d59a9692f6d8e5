import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { routes } from '@/router/routes'
import { useSyncStore } from '@/stores/sync'
import SyncStatus from '@/components/sync/SyncStatus.vue'

let pinia: Pinia

async function mountStatus(state: Partial<ReturnType<typeof useSyncStore>>) {
  const sync = useSyncStore()
  Object.assign(sync, { start: vi.fn(), ...state })
  const router = createRouter({ history: createMemoryHistory(), routes })
  const wrapper = mount(SyncStatus, { attachTo: document.body, global: { plugins: [createVuetify(), router, pinia] } })
  await wrapper.find('[data-testid="sync-status"]').trigger('click')
  await flushPromises()
  return { wrapper, sync, details: () => document.querySelector('[data-testid="sync-details"]')?.textContent ?? '' }
}

describe('SyncStatus in the app bar', () => {
  beforeEach(() => {
    document.body.innerHTML = ''
    pinia = createPinia()
    setActivePinia(pinia)
  })

  it('shows at a glance how many exams wait for the server and how many need attention', async () => {
    const { wrapper } = await mountStatus({ unsynced: 3, attention: 1 })

    expect(wrapper.find('[data-testid="sync-unsynced-count"]').text()).toBe('3')
    expect(wrapper.find('[data-testid="sync-attention-badge"]').text()).toContain('1')
    expect(wrapper.find('[data-testid="sync-status"]').attributes('aria-label')).toBe('Sync: Online; 3 not yet on the server; 1 need attention')
  })

  it('starts syncing once it is shown', async () => {
    const { sync } = await mountStatus({})

    expect(sync.start).toHaveBeenCalledOnce()
  })

  it('says when the device is offline, when it last synced and what needs the user', async () => {
    const { details } = await mountStatus({ online: false, unsynced: 1, attention: 2, lastSyncAt: '2026-03-14T09:30:00.000Z' })

    expect(details()).toContain('Offline: exams are kept on this device')
    expect(details()).toContain('1 exam not yet on the server')
    expect(details()).toContain('Last synced')
    expect(details()).toContain('2 need your attention')
  })

  it('asks the user to sign in again when the session ended', async () => {
    const { details } = await mountStatus({ needsSignIn: true, unsynced: 2 })

    expect(details()).toContain('Sign in again to send your exams')
  })

  it('keeps the menu within a phone screen and lets a long message wrap instead of cutting it', async () => {
    const lastError = 'The server refused the exam because its team no longer exists; ask an admin to restore the team'
    await mountStatus({ lastError })

    const card = document.querySelector<HTMLElement>('[data-testid="sync-details"]')!
    expect(card.classList).toContain('sync-details')
    expect(card.style.maxWidth).toContain('100vw')
    expect(card.textContent).toContain(lastError)
  })
})

import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createVuetify } from 'vuetify'
import { db } from '@/db'
import { useSessionStore } from '@/stores/session'
import { useSyncStore } from '@/stores/sync'
import * as auth from '@/api/auth'
import SyncSignOutDialog from '@/components/sync/SyncSignOutDialog.vue'
import { clearDevice, save } from '../../db/outbox-factory'
import { makeUser } from '../../factories/user'

vi.mock('@/api/auth', () => ({ login: vi.fn(), refresh: vi.fn(), logout: vi.fn(), fetchMe: vi.fn(), fetchHealth: vi.fn() }))

let pinia: Pinia

async function openDialog() {
  Object.assign(useSessionStore(), { user: makeUser({ id: 'u-1' }), token: 'token' })
  const wrapper = mount(SyncSignOutDialog, {
    props: { modelValue: true, work: { changes: 1, drafts: 0, photos: 0 } },
    attachTo: document.body,
    global: { plugins: [createVuetify(), pinia] },
  })
  await flushPromises()
  const click = async (testId: string) => {
    document.querySelector<HTMLElement>(`[data-testid="${testId}"]`)!.click()
    await flushPromises()
  }
  return { wrapper, click, text: () => document.querySelector('[data-testid="sign-out-dialog"]')?.textContent ?? '' }
}

describe('SyncSignOutDialog', () => {
  beforeEach(async () => {
    document.body.innerHTML = ''
    pinia = createPinia()
    setActivePinia(pinia)
    await clearDevice()
    vi.mocked(auth.logout).mockReset().mockResolvedValue(undefined)
  })

  it('warns that work has not reached the server and that signing out deletes it from the device', async () => {
    await save()

    const { text } = await openDialog()

    expect(text()).toContain('1 saved change has not reached the server')
    expect(text()).toContain('Signing out deletes everything')
  })

  it('deletes the work and signs out only when the user chooses to', async () => {
    await save()
    const { wrapper, click } = await openDialog()

    await click('sign-out-discard')

    await vi.waitFor(() => expect(wrapper.emitted('signed-out')).toHaveLength(1))
    expect(await db.outbox.count()).toBe(0)
    expect(useSessionStore().signedIn).toBe(false)
  })

  it('offers to sync first and, when the work still cannot be sent, keeps it and stays signed in', async () => {
    await save()
    const sync = useSyncStore()
    vi.spyOn(sync, 'syncNow').mockResolvedValue()
    const { wrapper, click, text } = await openDialog()

    await click('sign-out-sync-first')

    await vi.waitFor(() => expect(text()).toContain('Some work could still not be sent'))
    expect(sync.syncNow).toHaveBeenCalledOnce()
    expect(wrapper.emitted('signed-out')).toBeUndefined()
    expect(await db.outbox.count()).toBe(1)
  })

  it('signs out after syncing once nothing is left to send', async () => {
    await save()
    const sync = useSyncStore()
    vi.spyOn(sync, 'syncNow').mockImplementation(async () => void (await db.outbox.clear()))
    const { wrapper, click } = await openDialog()

    await click('sign-out-sync-first')

    await vi.waitFor(() => expect(wrapper.emitted('signed-out')).toHaveLength(1))
    expect(useSessionStore().signedIn).toBe(false)
  })
})

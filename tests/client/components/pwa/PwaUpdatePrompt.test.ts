import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import { VSnackbar } from 'vuetify/components'
import type { RegisterSWOptions } from 'vite-plugin-pwa/types'
import PwaUpdatePrompt from '@/components/pwa/PwaUpdatePrompt.vue'
import { appUpdateKey, createAppUpdate } from '@/plugins/pwa'

/** The app's update state over a fake `registerSW` that records its options, as vite-plugin-pwa's would receive them. */
async function mountPrompt() {
  let options: RegisterSWOptions = {}
  const updateSW = vi.fn(async (_reloadPage?: boolean) => undefined)
  const reload = vi.fn()
  const appUpdate = createAppUpdate(async () => (given) => {
    options = given
    return updateSW
  }, reload)
  await appUpdate.start()
  const wrapper = mount(PwaUpdatePrompt, {
    global: { plugins: [createVuetify()], provide: { [appUpdateKey as symbol]: appUpdate } },
    attachTo: document.body,
  })
  return { wrapper, options: () => options, updateSW, reload }
}

const prompt = () => document.querySelector('[data-testid="update-prompt"]')
const button = (testId: string) => document.querySelector<HTMLButtonElement>(`[data-testid="${testId}"]`)

describe('the "new version" prompt', () => {
  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('stays hidden while no new version is waiting', async () => {
    await mountPrompt()
    await flushPromises()

    expect(prompt()).toBeNull()
  })

  it('shows when the service worker reports a waiting version, and neither updates nor reloads by itself', async () => {
    const { options, updateSW, reload } = await mountPrompt()

    options().onNeedRefresh?.()
    await flushPromises()

    expect(prompt()?.textContent).toContain('A new version of Plumbline is ready')
    expect(updateSW).not.toHaveBeenCalled()
    expect(reload).not.toHaveBeenCalled()
  })

  it('"Update now" activates the waiting version, and the page reloads once it takes control', async () => {
    const { options, updateSW, reload } = await mountPrompt()
    options().onNeedRefresh?.()
    await flushPromises()

    button('update-now')?.click()
    await flushPromises()
    options().onNeedReload?.()

    expect(updateSW).toHaveBeenCalledExactlyOnceWith(true)
    expect(reload).toHaveBeenCalledOnce()
  })

  it('"Later" hides the prompt without updating', async () => {
    const { wrapper, options, updateSW } = await mountPrompt()
    options().onNeedRefresh?.()
    await flushPromises()

    button('update-later')?.click()
    await flushPromises()

    expect(wrapper.findComponent(VSnackbar).props('modelValue')).toBe(false)
    expect(updateSW).not.toHaveBeenCalled()
  })

  it('when another tab applied the update, this tab keeps its page and asks instead of reloading', async () => {
    const { options, updateSW, reload } = await mountPrompt()
    options().onNeedRefresh?.()

    options().onNeedReload?.()
    await flushPromises()

    expect(reload).not.toHaveBeenCalled()
    expect(prompt()).not.toBeNull()
    button('update-now')?.click()
    await flushPromises()
    expect(reload).toHaveBeenCalledOnce()
    expect(updateSW).not.toHaveBeenCalled()
  })
})

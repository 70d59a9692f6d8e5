import { beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { VApp } from 'vuetify/components'
import TheAppBar from '@/components/TheAppBar.vue'
import { createInstallPrompt, installPromptKey } from '@/components/pwa/install-prompt'
import { routes } from '@/router/routes'

vi.mock('@/api/auth', () => ({ login: vi.fn(), refresh: vi.fn(), logout: vi.fn(), fetchMe: vi.fn(), fetchHealth: vi.fn() }))

let pinia: Pinia

async function mountBar() {
  const target = new EventTarget()
  const router = createRouter({ history: createMemoryHistory(), routes })
  const Shell = defineComponent({ setup: () => () => h(VApp, () => h(TheAppBar)) })
  const wrapper = mount(Shell, {
    global: { plugins: [createVuetify(), pinia, router], provide: { [installPromptKey as symbol]: createInstallPrompt(target) } },
  })
  await flushPromises()
  return { wrapper, target }
}

describe('TheAppBar', () => {
  beforeEach(() => {
    pinia = createPinia()
    setActivePinia(pinia)
  })

  it("gives the title no colour of its own, so it takes the bar's on-primary text colour in either theme", async () => {
    const { wrapper } = await mountBar()

    const title = wrapper.get('.v-app-bar-title a')

    expect(title.text()).toBe('Plumbline')
    expect([...title.element.classList].filter((name) => /^(text|bg)-(?!decoration)/.test(name))).toEqual([])
  })

  it('when signed out, shows neither the sync status nor the account menu', async () => {
    const { wrapper } = await mountBar()

    expect(wrapper.find('[data-testid="sync-status"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="user-menu"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="theme-toggle"]').exists()).toBe(true)
  })

  it('shows the install button, loaded on demand, once the browser offers installation', async () => {
    const { wrapper, target } = await mountBar()

    target.dispatchEvent(
      Object.assign(new Event('beforeinstallprompt', { cancelable: true }), { prompt: vi.fn(), userChoice: new Promise(() => undefined) }),
    )

    await vi.waitFor(async () => {
      await flushPromises()
      expect(wrapper.find('[data-testid="install-app"]').exists()).toBe(true)
    })
  })
})

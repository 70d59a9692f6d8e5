import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import PwaInstallButton from '@/components/pwa/PwaInstallButton.vue'
import { createInstallPrompt, installPromptKey } from '@/components/pwa/install-prompt'

function mountButton(icon = false) {
  const target = new EventTarget()
  const wrapper = mount(PwaInstallButton, {
    props: { icon },
    global: { plugins: [createVuetify()], provide: { [installPromptKey as symbol]: createInstallPrompt(target) } },
  })
  return { wrapper, target }
}

/** What Chromium fires when the app can be installed. */
function offerInstall(target: EventTarget, outcome: 'accepted' | 'dismissed' = 'accepted') {
  const event = Object.assign(new Event('beforeinstallprompt', { cancelable: true }), {
    prompt: vi.fn(async () => undefined),
    userChoice: Promise.resolve({ outcome, platform: 'web' }),
  })
  target.dispatchEvent(event)
  return event
}

describe('the install button', () => {
  afterEach(() => {
    vi.restoreAllMocks()
  })

  it('is hidden until the browser offers installation', () => {
    const { wrapper } = mountButton()

    expect(wrapper.find('[data-testid="install-app"]').exists()).toBe(false)
  })

  it('appears once the browser offers installation, keeping the browser\'s own prompt back', async () => {
    const { wrapper, target } = mountButton(true)

    const event = offerInstall(target)
    await flushPromises()

    expect(wrapper.find('[data-testid="install-app"]').attributes('aria-label')).toBe('Install Plumbline')
    expect(event.defaultPrevented).toBe(true)
    expect(event.prompt).not.toHaveBeenCalled()
  })

  it('shows the browser\'s install dialog on click, then hides: an offer can be used once', async () => {
    const { wrapper, target } = mountButton()
    const event = offerInstall(target, 'dismissed')
    await flushPromises()

    await wrapper.find('[data-testid="install-app"]').trigger('click')
    await flushPromises()

    expect(event.prompt).toHaveBeenCalledOnce()
    expect(wrapper.find('[data-testid="install-app"]').exists()).toBe(false)
  })

  it('hides when the app gets installed another way (the browser menu)', async () => {
    const { wrapper, target } = mountButton()
    offerInstall(target)
    await flushPromises()

    target.dispatchEvent(new Event('appinstalled'))
    await flushPromises()

    expect(wrapper.find('[data-testid="install-app"]').exists()).toBe(false)
  })
})

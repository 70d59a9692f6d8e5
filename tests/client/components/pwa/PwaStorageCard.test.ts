import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import PwaStorageCard from '@/components/pwa/PwaStorageCard.vue'

// jsdom has no navigator.storage, which also stands in for the browsers that lack it
function stubStorage(storage: Partial<StorageManager> | undefined) {
  Object.defineProperty(navigator, 'storage', { value: storage, configurable: true })
}

async function mountCard() {
  const wrapper = mount(PwaStorageCard, { global: { plugins: [createVuetify()] } })
  await flushPromises()
  return wrapper
}

describe('the storage card on "This device"', () => {
  afterEach(() => {
    Reflect.deleteProperty(navigator, 'storage')
  })

  it('asks for persistent storage on click and shows the outcome', async () => {
    const persist = vi.fn(async () => true)
    stubStorage({ persisted: async () => false, persist, estimate: async () => ({ usage: 2048, quota: 1024 ** 3 }) })
    const wrapper = await mountCard()
    expect(wrapper.find('[data-testid="storage-estimate"]').text()).toBe('2.0 KB used of about 1.0 GB available to Plumbline.')

    await wrapper.find('[data-testid="storage-ask"]').trigger('click')
    await flushPromises()

    expect(persist).toHaveBeenCalledOnce()
    expect(wrapper.find('[data-testid="storage-persistence"]').text()).toMatch(/^Granted/)
    expect(wrapper.find('[data-testid="storage-ask"]').exists()).toBe(false)
  })

  it('without the storage API, shows text rather than nothing', async () => {
    stubStorage(undefined)

    const wrapper = await mountCard()

    expect(wrapper.find('[data-testid="storage-persistence"]').text()).toContain('Not available in this browser')
    expect(wrapper.find('[data-testid="storage-estimate"]').text()).toContain('does not report')
    expect(wrapper.find('[data-testid="storage-ask"]').exists()).toBe(false)
  })
})

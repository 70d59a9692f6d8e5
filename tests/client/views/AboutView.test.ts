import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import AboutView from '@/views/AboutView.vue'
import { appUpdateKey, createAppUpdate } from '@/plugins/pwa'
import { db } from '@/db/index'
import { useTechniquePromptsStore } from '@/stores/technique-prompts'

async function mountAbout() {
  const appUpdate = createAppUpdate(async () => () => async () => undefined, () => undefined)
  const wrapper = mount(AboutView, { global: { plugins: [createVuetify()], provide: { [appUpdateKey as symbol]: appUpdate } }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

describe('AboutView: technique tips', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await db.meta.clear()
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('says how many tips are hidden on this device and shows them all again on request', async () => {
    await db.meta.put({ key: 'technique-prompts-dismissed', value: ['end-expiration', 'tangential-light'] })
    const wrapper = await mountAbout()
    expect(wrapper.find('[data-testid="device-technique-tips"]').text()).toContain('2 hidden on this device')

    await wrapper.find('[data-testid="device-technique-restore"]').trigger('click')
    await flushPromises()

    expect(useTechniquePromptsStore().dismissed).toEqual([])
    expect((await db.meta.get('technique-prompts-dismissed'))?.value).toEqual([])
    expect(wrapper.find('[data-testid="device-technique-restore"]').exists()).toBe(false)
  })
})

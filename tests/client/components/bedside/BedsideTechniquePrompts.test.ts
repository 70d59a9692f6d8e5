import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import BedsideTechniquePrompts from '@/components/bedside/BedsideTechniquePrompts.vue'
import { db } from '@/db/index'

async function mountPrompts(step: number) {
  const wrapper = mount(BedsideTechniquePrompts, { props: { step }, global: { plugins: [createVuetify()] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

const shown = (wrapper: Awaited<ReturnType<typeof mountPrompts>>) =>
  wrapper.findAll('[data-testid^="technique-"]').map((el) => el.attributes('data-testid')).filter((id) => !id!.includes('dismiss') && id !== 'technique-prompts')

describe('BedsideTechniquePrompts', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await db.meta.clear()
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('on the height step, reminds to adjust the bed, read at end-expiration and read the mean level with large v waves', async () => {
    const wrapper = await mountPrompts(2)

    expect(shown(wrapper)).toEqual(['technique-adjust-bed', 'technique-end-expiration', 'technique-mean-level'])
    expect(wrapper.text()).toContain('end-expiration')
  })

  it('on the pulsation step, reminds of tangential light and where the vein lies', async () => {
    const wrapper = await mountPrompts(1)

    expect(shown(wrapper)).toEqual(['technique-tangential-light', 'technique-between-sternocleidomastoid'])
  })

  it('a dismissed prompt is gone, and stays gone the next time the step opens on this device', async () => {
    const wrapper = await mountPrompts(0)
    expect(shown(wrapper)).toEqual(['technique-head-supported'])

    await wrapper.find('[data-testid="technique-dismiss-head-supported"]').trigger('click')
    await flushPromises()
    expect(shown(wrapper)).toEqual([])
    wrapper.unmount()
    setActivePinia(createPinia())
    const again = await mountPrompts(0)

    expect(shown(again)).toEqual([])
  })
})

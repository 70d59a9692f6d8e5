import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import BedsideInclinationField from '@/components/bedside/BedsideInclinationField.vue'

function mountField(inclinationDeg: number | null = null) {
  return mount(BedsideInclinationField, { props: { inclinationDeg, source: 'entered' }, global: { plugins: [createVuetify()] } })
}

describe('BedsideInclinationField', () => {
  afterEach(() => {
    delete (window as { DeviceOrientationEvent?: unknown }).DeviceOrientationEvent
  })

  it('typing an angle records it as entered', async () => {
    const wrapper = mountField()

    await wrapper.find('[data-testid="inclination-input"] input').setValue('30')

    expect(wrapper.emitted('update')).toContainEqual([{ inclinationDeg: 30, inclinationSource: 'entered' }])
  })

  it('an angle measured by the phone is recorded with the sensor as its source', async () => {
    Object.assign(window, { DeviceOrientationEvent: class {} })
    const wrapper = mountField()

    await wrapper.find('[data-testid="inclination-measure"]').trigger('click')
    await flushPromises()
    window.dispatchEvent(Object.assign(new Event('deviceorientation'), { beta: 45 }))
    await flushPromises()
    await wrapper.find('[data-testid="inclination-use"]').trigger('click')

    expect(wrapper.emitted('update')).toContainEqual([{ inclinationDeg: 45, inclinationSource: 'sensor' }])
  })

  it('without a tilt sensor, falls back to entry with a note', async () => {
    const wrapper = mountField()

    await wrapper.find('[data-testid="inclination-measure"]').trigger('click')
    await flushPromises()

    expect(wrapper.find('[data-testid="inclination-fallback"]').text()).toContain('enter the angle')
    expect(wrapper.find('[data-testid="inclination-input"]').exists()).toBe(true)
  })
})

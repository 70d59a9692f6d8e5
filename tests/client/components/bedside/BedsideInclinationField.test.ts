import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import BedsideInclinationField from '@/components/bedside/BedsideInclinationField.vue'

function mountField(inclinationDeg: number | null = null, source: 'entered' | 'sensor' = 'entered', confirmed?: boolean) {
  return mount(BedsideInclinationField, { props: { inclinationDeg, source, confirmed }, global: { plugins: [createVuetify()] } })
}

describe('BedsideInclinationField', () => {
  afterEach(() => {
    delete (window as { DeviceOrientationEvent?: unknown }).DeviceOrientationEvent
  })

  it('while the angle is empty, the slider shows no position; once typed, it shows one', async () => {
    const wrapper = mountField(null)

    const slider = () => wrapper.find('[data-testid="inclination-slider"]')
    expect(slider().classes()).toContain('inclination-slider--empty')
    await wrapper.setProps({ inclinationDeg: 0 })
    expect(slider().classes()).not.toContain('inclination-slider--empty')
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

  it('after a phone reading, asks to confirm the trunk angle (pillows, slumping) and records the confirmation', async () => {
    const wrapper = mountField(40, 'sensor')

    const prompt = wrapper.find('[data-testid="inclination-confirm"]').text()
    await wrapper.find('[data-testid="inclination-confirm-button"]').trigger('click')

    expect(prompt).toContain('The phone measured the bed back at 40°')
    expect(prompt).toContain('Pillows')
    expect(wrapper.emitted('update')).toContainEqual([{ inclinationConfirmed: true }])
  })

  it('asks nothing once the trunk angle is confirmed, nor for an angle typed in', () => {
    const confirmed = mountField(40, 'sensor', true)
    const typed = mountField(40, 'entered')

    expect(confirmed.find('[data-testid="inclination-confirm"]').exists()).toBe(false)
    expect(typed.find('[data-testid="inclination-confirm"]').exists()).toBe(false)
  })
})

import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import BedsideAbdominojugularField from '@/components/bedside/BedsideAbdominojugularField.vue'

function mountField(test = { done: true }) {
  return mount(BedsideAbdominojugularField, { props: { test, errors: {} }, global: { plugins: [createVuetify()] } })
}

describe('BedsideAbdominojugularField', () => {
  // Cook & Simel 1996 (JAMA 275:630–634) and Ewy 1988 (Ann Intern Med 109:456–460): pressure held with normal breathing.
  it('says how to do the test: firm mid-abdominal pressure for 10–60 s, breathing normally, no Valsalva', () => {
    const wrapper = mountField()

    expect(wrapper.find('[data-testid="abdominojugular-instruction"]').text()).toContain(
      'Firm mid-abdominal pressure for 10–60 s, patient breathing normally — no Valsalva',
    )
  })

  it('asks the rise, whether it was sustained, and the fall on release, each in cm', async () => {
    const wrapper = mountField()

    await wrapper.find('[data-testid="abdominojugular-rise"] input').setValue('4,5')
    await wrapper.find('[data-testid="abdominojugular-fall"] input').setValue('4')

    expect(wrapper.find('[data-testid="abdominojugular-sustained"]').exists()).toBe(true)
    expect(wrapper.emitted('update')).toEqual([[{ done: true, riseCm: 4.5 }], [{ done: true, fallOnReleaseCm: 4 }]])
  })

  it('asks nothing more while the test was not done', () => {
    const wrapper = mountField({ done: false })

    expect(wrapper.find('[data-testid="abdominojugular-rise"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="abdominojugular-fall"]').exists()).toBe(false)
  })
})

import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import BedsideNumberField from '@/components/bedside/BedsideNumberField.vue'

function mountField(modelValue: number | null = null, error?: string) {
  return mount(BedsideNumberField, {
    props: { modelValue, label: 'Height', suffix: 'cm', error, 'onUpdate:modelValue': () => undefined },
    global: { plugins: [createVuetify()] },
  })
}

const input = (wrapper: ReturnType<typeof mountField>) => wrapper.find<HTMLInputElement>('input')

describe('BedsideNumberField', () => {
  it('typed with a decimal comma, "2,5" sends 2.5 and keeps "2,5" on screen', async () => {
    const wrapper = mountField()

    await input(wrapper).setValue('2,5')
    await wrapper.setProps({ modelValue: 2.5 })

    expect(wrapper.emitted('update:modelValue')).toEqual([[2.5]])
    expect(input(wrapper).element.value).toBe('2,5')
  })

  it('is a text field with a decimal keyboard, so no browser drops the comma', () => {
    const wrapper = mountField()

    expect(input(wrapper).attributes('type')).toBe('text')
    expect(input(wrapper).attributes('inputmode')).toBe('decimal')
  })

  it('something unreadable sends no number and shows a field message', async () => {
    const wrapper = mountField(4)

    await input(wrapper).setValue('2,5,1')

    expect(wrapper.emitted('update:modelValue')).toEqual([[null]])
    expect(wrapper.text()).toContain('Type a number such as 2.5')
  })

  it('the message goes once the text reads as a number', async () => {
    const wrapper = mountField()
    await input(wrapper).setValue('4x')

    await input(wrapper).setValue('4')

    expect(wrapper.text()).not.toContain('Type a number')
    expect(wrapper.emitted('update:modelValue')).toEqual([[null], [4]])
  })

  it('shows the value given from outside, e.g. a draft opened again', async () => {
    const wrapper = mountField()

    await wrapper.setProps({ modelValue: 6.5 })

    expect(input(wrapper).element.value).toBe('6.5')
  })

  it('shows the error it is given while the text reads as a number', () => {
    const wrapper = mountField(95, 'Inclination is at most 90° (upright)')

    expect(wrapper.text()).toContain('Inclination is at most 90° (upright)')
  })
})

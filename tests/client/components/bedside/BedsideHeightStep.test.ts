import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import type { DraftFields } from '@/db/draft-schema'
import BedsideHeightStep from '@/components/bedside/BedsideHeightStep.vue'

function mountStep(fields: DraftFields, errors: Record<string, string> = {}) {
  return mount(BedsideHeightStep, { props: { fields: { inclinationDeg: 45, ...fields }, errors }, global: { plugins: [createVuetify()] } })
}

describe('BedsideHeightStep', () => {
  it('when the column top is seen, asks for the height with the vertical rule, its precision and the diagram', () => {
    const wrapper = mountStep({ columnTop: 'seen', heightMethod: 'vertical' })

    expect(wrapper.find('[data-testid="height-cm"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="reading-precision"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="height-diagram"]').exists()).toBe(true)
  })

  it('shows a height error under the height field', () => {
    const wrapper = mountStep({ columnTop: 'seen', heightMethod: 'vertical' }, { heightCm: 'Enter the height of the column top above the sternal angle' })

    expect(wrapper.find('[data-testid="height-cm"]').text()).toContain('Enter the height of the column top')
  })

  it('measured along the neck, asks for that distance instead', () => {
    const wrapper = mountStep({ columnTop: 'seen', heightMethod: 'along-neck' })

    expect(wrapper.find('[data-testid="along-neck-cm"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="height-cm"]').exists()).toBe(false)
  })

  it('when no column fills even lying flat, asks for no height', () => {
    const wrapper = mountStep({ columnTop: 'not-filled' })

    expect(wrapper.find('[data-testid="height-cm"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="height-diagram"]').exists()).toBe(false)
  })

  it('typing a height sends it as a number', async () => {
    const wrapper = mountStep({ columnTop: 'seen', heightMethod: 'vertical' })

    await wrapper.find('[data-testid="height-cm"] input').setValue('4.5')

    expect(wrapper.emitted('update')).toContainEqual([{ heightCm: 4.5 }])
  })
})

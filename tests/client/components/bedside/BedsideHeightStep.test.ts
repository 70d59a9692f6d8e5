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

  it('"no column" at 30° asks to lower the bed and look again, or to record the column as not assessable', async () => {
    const wrapper = mountStep({ columnTop: 'not-filled', inclinationDeg: 30 })

    const prompt = wrapper.find('[data-testid="not-filled-too-steep"]')
    await wrapper.find('[data-testid="not-filled-not-assessable"]').trigger('click')
    await wrapper.find('[data-testid="not-filled-change-angle"]').trigger('click')

    expect(prompt.text()).toContain('needs the bed at 10° or flatter')
    expect(wrapper.emitted('update')).toContainEqual([{ columnTop: 'not-assessable' }])
    expect(wrapper.emitted('change-angle')).toHaveLength(1)
  })

  it('"no column" lying flat asks nothing more', () => {
    const wrapper = mountStep({ columnTop: 'not-filled', inclinationDeg: 0 })

    expect(wrapper.find('[data-testid="not-filled-too-steep"]').exists()).toBe(false)
  })

  it('not assessable asks for the reason, and for the text of another reason', async () => {
    const wrapper = mountStep({ columnTop: 'not-assessable', notAssessableReason: 'other' }, { notAssessableText: 'Describe the reason the column could not be assessed' })

    await wrapper.find('[data-testid="not-assessable-text"] input').setValue('Neck brace')

    expect(wrapper.find('[data-testid="not-assessable-reason"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="not-assessable-text"]').text()).toContain('Describe the reason')
    expect(wrapper.emitted('update')).toContainEqual([{ notAssessableText: 'Neck brace' }])
  })

  it('a column above the neck at 45° first asks to sit the patient up, then accepts the confirmation', async () => {
    const wrapper = mountStep({ columnTop: 'above-neck', heightMethod: 'vertical', inclinationDeg: 45 })

    const prompt = wrapper.find('[data-testid="above-neck-sit-up"]').text()
    await wrapper.find('[data-testid="above-neck-confirm"]').trigger('click')
    await wrapper.setProps({ fields: { columnTop: 'above-neck', heightMethod: 'vertical', inclinationDeg: 45, aboveNeckConfirmedDeg: 45 } })

    expect(prompt).toContain('Sit the patient up and look again')
    expect(wrapper.emitted('update')).toContainEqual([{ aboveNeckConfirmedDeg: 45 }])
    expect(wrapper.find('[data-testid="above-neck-sit-up"]').exists()).toBe(false)
  })

  it('a column above the neck sitting upright asks nothing more', () => {
    const wrapper = mountStep({ columnTop: 'above-neck', heightMethod: 'vertical', inclinationDeg: 80 })

    expect(wrapper.find('[data-testid="above-neck-sit-up"]').exists()).toBe(false)
  })

  it('a refused reading along the neck shows the field message and offers the vertical ruler', async () => {
    const message = 'Below 30° a reading along the neck is unreliable: hold a ruler vertical at the sternal angle and enter the vertical height'
    const wrapper = mountStep({ columnTop: 'seen', heightMethod: 'along-neck', inclinationDeg: 20 }, { heightMethod: message })

    await wrapper.find('[data-testid="height-method-error"] button').trigger('click')

    expect(wrapper.find('[data-testid="height-method-error"]').text()).toContain(message)
    expect(wrapper.emitted('update')).toContainEqual([{ heightMethod: 'vertical' }])
  })

  it('typing "2,5" sends 2.5 cm, never 25', async () => {
    const wrapper = mountStep({ columnTop: 'seen', heightMethod: 'vertical' })

    await wrapper.find('[data-testid="height-cm"] input').setValue('2,5')

    expect(wrapper.emitted('update')).toContainEqual([{ heightCm: 2.5 }])
  })
})

import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import type { VenousSign } from '#shared/schemas/exam'
import BedsidePulsationStep from '@/components/bedside/BedsidePulsationStep.vue'

function mountStep(venousSigns: VenousSign[]) {
  return mount(BedsidePulsationStep, { props: { fields: { venousSigns, rhythm: 'sinus' }, errors: {} }, global: { plugins: [createVuetify()] } })
}

describe('BedsidePulsationStep', () => {
  it('with two venous signs, warns that the pulsation may be arterial', () => {
    const wrapper = mountStep(['not-palpable', 'double-peaked'])

    expect(wrapper.find('[data-testid="venous-sign-warning"]').text()).toContain('may be arterial')
    expect(wrapper.find('[data-testid="venous-sign-count"]').text()).toBe('2 of 6 signs')
  })

  it('with three venous signs, shows no warning', () => {
    const wrapper = mountStep(['not-palpable', 'double-peaked', 'falls-on-inspiration'])

    expect(wrapper.find('[data-testid="venous-sign-warning"]').exists()).toBe(false)
  })

  it('the warning goes away as soon as the third sign is ticked', async () => {
    const wrapper = mountStep(['not-palpable', 'double-peaked'])

    await wrapper.find('[data-testid="sign-changes-with-position"] input').setValue(true)
    const patch = wrapper.emitted('update')![0]![0] as { venousSigns: VenousSign[] }
    await wrapper.setProps({ fields: { venousSigns: patch.venousSigns } })

    expect(patch.venousSigns).toEqual(['not-palpable', 'double-peaked', 'changes-with-position'])
    expect(wrapper.find('[data-testid="venous-sign-warning"]').exists()).toBe(false)
  })
})

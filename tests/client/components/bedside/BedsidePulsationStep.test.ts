import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import type { DraftFields } from '@/db/draft-schema'
import BedsidePulsationStep from '@/components/bedside/BedsidePulsationStep.vue'

type Signs = NonNullable<DraftFields['venousSigns']>

function mountStep(venousSigns: Signs, rhythm: DraftFields['rhythm'] = 'sinus') {
  return mount(BedsidePulsationStep, { props: { fields: { venousSigns, rhythm }, errors: {} }, global: { plugins: [createVuetify()] } })
}

const exists = (wrapper: ReturnType<typeof mountStep>, testid: string) => wrapper.find(`[data-testid="${testid}"]`).exists()

describe('BedsidePulsationStep', () => {
  it('asks each of the six signs as present, absent or not tested', () => {
    const wrapper = mountStep({})

    const choices = wrapper.findAll('[data-testid^="sign-"][data-testid$="-not-tested"]')

    expect(choices).toHaveLength(6)
    expect(exists(wrapper, 'sign-not-palpable-present')).toBe(true)
    expect(exists(wrapper, 'sign-not-palpable-absent')).toBe(true)
  })

  it('answering a sign sends every sign with its state, the others kept', async () => {
    const wrapper = mountStep({ 'not-palpable': 'present' })

    await wrapper.find('[data-testid="sign-double-peaked-absent"]').trigger('click')

    const patch = wrapper.emitted('update')![0]![0] as { venousSigns: Signs }
    expect(patch.venousSigns).toMatchObject({ 'not-palpable': 'present', 'double-peaked': 'absent', 'falls-on-inspiration': 'not-tested' })
  })

  // Cook & Simel 1996 (JAMA 275:630–634): fewer than the setting's 3 signs (product default) leaves the origin in doubt.
  it('with two venous signs present, warns that the pulsation may be arterial, naming the required three', () => {
    const wrapper = mountStep({ 'not-palpable': 'present', 'double-peaked': 'present' })

    expect(wrapper.find('[data-testid="venous-sign-warning"]').text()).toContain('fewer than the 3 required')
    expect(wrapper.find('[data-testid="venous-sign-count"]').text()).toBe('2 of 6 signs found')
  })

  it('with three venous signs present, shows no warning', () => {
    const wrapper = mountStep({ 'not-palpable': 'present', 'double-peaked': 'present', 'falls-on-inspiration': 'present' })

    expect(exists(wrapper, 'venous-sign-warning')).toBe(false)
    expect(exists(wrapper, 'arterial-evidence-warning')).toBe(false)
  })

  // Cook & Simel 1996: a palpable pulsation, or one light pressure does not obliterate, behaves like the carotid.
  it.each(['not-palpable', 'obliterated-by-light-pressure'] as const)('with "%s" recorded absent, says the pulsation suggests the carotid', (sign) => {
    const wrapper = mountStep({ 'double-peaked': 'present', 'falls-on-inspiration': 'present', 'changes-with-position': 'present', [sign]: 'absent' })

    expect(wrapper.find('[data-testid="arterial-evidence-warning"]').text()).toContain('confirm that the column you measure is venous')
  })

  it('a sign merely not tested is no arterial evidence', () => {
    const wrapper = mountStep({ 'double-peaked': 'present', 'falls-on-inspiration': 'present', 'changes-with-position': 'present' })

    expect(exists(wrapper, 'arterial-evidence-warning')).toBe(false)
  })
})

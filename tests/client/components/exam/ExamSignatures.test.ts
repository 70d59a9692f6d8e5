import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import type { Signature } from '#shared/schemas/signature'
import ExamSignatures from '@/components/exam/ExamSignatures.vue'
import { makeSignature } from '../../factories/signature'

function mountSignatures(signatures: Signature[]) {
  return mount(ExamSignatures, { props: { signatures }, global: { plugins: [createVuetify()] } })
}

describe('ExamSignatures', () => {
  it("shows the signer's printed name, the date and time in the signing zone, and the meaning in words", () => {
    const wrapper = mountSignatures([makeSignature()])

    expect(wrapper.find('[data-testid="signature-name"]').text()).toBe('Dr Tomas Lindqvist')
    expect(wrapper.find('[data-testid="signature-time"]').text()).toBe('14 Jul 2026, 09:30 BST (Europe/London)')
    expect(wrapper.find('[data-testid="signature-meaning"]').text()).toBe('Reviewed, and agrees with the findings')
  })

  it('gives a UTC signature its zone without repeating it', () => {
    const wrapper = mountSignatures([makeSignature({ signedAt: '2026-03-14T09:30:00.000Z', timeZone: 'UTC' })])

    expect(wrapper.find('[data-testid="signature-time"]').text()).toBe('14 Mar 2026, 09:30 UTC')
  })

  it('marks a signature of an amended version as superseded, with when, and keeps showing it', () => {
    const old = makeSignature({ id: 'sig-old', superseded: true, supersededAt: '2026-07-15T08:00:00.000+01:00', meaning: 'reviewed-re-examined' })
    const current = makeSignature({ id: 'sig-new', examVersion: 3 })

    const wrapper = mountSignatures([old, current])

    const oldBlock = wrapper.find('[data-testid="signature-sig-old"]')
    expect(oldBlock.find('[data-testid="signature-superseded"]').text()).toBe('Superseded')
    expect(oldBlock.find('[data-testid="signature-superseded-note"]').text()).toContain('15 Jul 2026, 08:00 BST')
    expect(oldBlock.find('[data-testid="signature-meaning"]').text()).toBe('Reviewed after examining the patient in person')
    expect(wrapper.find('[data-testid="signature-sig-new"] [data-testid="signature-superseded"]').exists()).toBe(false)
  })

  it('when the record no longer matches its signature, shows a prominent integrity warning', () => {
    const wrapper = mountSignatures([makeSignature({ valid: false })])

    const warning = wrapper.find('[data-testid="signature-integrity-warning"]')
    expect(warning.exists()).toBe(true)
    expect(warning.text()).toContain('no longer matches what Dr Tomas Lindqvist signed')
  })

  it('shows no integrity warning for a valid signature', () => {
    const wrapper = mountSignatures([makeSignature()])

    expect(wrapper.find('[data-testid="signature-integrity-warning"]').exists()).toBe(false)
  })
})

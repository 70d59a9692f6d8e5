import { beforeEach, describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import type { Signature } from '#shared/schemas/signature'
import ExamSignatures from '@/components/exam/ExamSignatures.vue'
import { FEEDBACK_LABEL } from '#shared/domain/feedback-text'
import { makeSignature } from '../../factories/signature'
import { makeUser } from '../../factories/user'
import { useSessionStore } from '@/stores/session'

function mountSignatures(signatures: Signature[]) {
  return mount(ExamSignatures, { props: { signatures }, global: { plugins: [createVuetify()] } })
}

describe('ExamSignatures', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it("when the signed-in user made the countersignature, says 'Countersigned by you'", () => {
    useSessionStore().user = makeUser({ id: 'att-7', roles: ['attending'] })

    const wrapper = mountSignatures([
      makeSignature({ id: 'sig-mine', signerId: 'att-7' }),
      makeSignature({ id: 'sig-other', signerId: 'att-8' }),
    ])

    expect(wrapper.find('[data-testid="signature-sig-mine"] [data-testid="signature-by-you"]').text()).toBe('Countersigned by you')
    expect(wrapper.find('[data-testid="signature-sig-other"] [data-testid="signature-by-you"]').exists()).toBe(false)
  })

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
    const old = makeSignature({
      id: 'sig-old',
      superseded: true,
      supersededAt: '2026-07-15T08:00:00.000+01:00',
      meaning: 'reviewed-re-examined',
    })
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

  it("shows the resident the attending's reading, the difference in words and the feedback", () => {
    const signature = makeSignature({
      meaning: 'reviewed-re-examined',
      attendingReading: {
        examId: 'att-exam',
        heightCm: 2,
        inclinationDeg: 45,
        examinedAt: '2026-07-14T08:20:00.000Z',
        cvpCmH2O: 11.1,
        differenceCmH2O: 2.6,
      },
      feedback: ['read-peak-not-mean', 'other'],
      feedbackText: 'Use the bed lever, not pillows.',
    })

    const wrapper = mountSignatures([signature])

    expect(wrapper.find('[data-testid="attending-reading-values"]').text()).toContain('2.0 cm above the sternal angle at 45°')
    expect(wrapper.find('[data-testid="attending-reading-values"]').text()).toContain('estimate 11.1 cmH₂O')
    expect(wrapper.find('[data-testid="attending-reading-difference"]').text()).toContain('+2.6 cmH₂O (the resident read higher)')
    const feedback = wrapper.findAll('[data-testid="attending-feedback"] li').map((li) => li.text())
    expect(feedback).toEqual([FEEDBACK_LABEL['read-peak-not-mean'], 'Use the bed lever, not pillows.'])
  })

  it('says there is no difference to take when one reading is a bound', () => {
    const signature = makeSignature({
      meaning: 'reviewed-re-examined',
      attendingReading: {
        examId: 'att-exam',
        heightCm: 2,
        inclinationDeg: 45,
        examinedAt: '2026-07-14T08:20:00.000Z',
        cvpCmH2O: 11.1,
        differenceCmH2O: null,
      },
    })

    const wrapper = mountSignatures([signature])

    expect(wrapper.find('[data-testid="attending-reading-difference"]').text()).toContain('No difference to take')
    expect(wrapper.find('[data-testid="attending-feedback"]').exists()).toBe(false)
  })

  it('shows no reading for a signature that agrees without re-examining', () => {
    const wrapper = mountSignatures([makeSignature()])

    expect(wrapper.find('[data-testid="attending-reading"]').exists()).toBe(false)
  })
})

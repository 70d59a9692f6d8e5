import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import type { ExamFindingsInput } from '#shared/schemas/exam'
import ExamResultCard from '@/components/exam/ExamResultCard.vue'
import { makeFindings } from '../../factories/draft'

function mountCard(overrides: Partial<ExamFindingsInput> = {}) {
  return mount(ExamResultCard, { props: { findings: makeFindings(overrides) }, global: { plugins: [createVuetify()] } })
}

function text(wrapper: ReturnType<typeof mountCard>, testid: string) {
  return wrapper.find(`[data-testid="${testid}"]`).text()
}

describe('ExamResultCard', () => {
  // PRODUCT.md §4 worked example: h 4 cm at 45°, ruler, incline-adjusted (Seth 2002 offset 9.7 cm).
  it('shows the worked example as 13.7 cmH₂O, 10.1 mmHg, band 9.2–18.2 cmH₂O', () => {
    const wrapper = mountCard()

    expect(text(wrapper, 'exam-estimate-cmh2o')).toBe('13.7 cmH₂O')
    expect(text(wrapper, 'exam-estimate-mmhg')).toBe('10.1 mmHg')
    expect(text(wrapper, 'exam-estimate-band')).toContain('9.2–18.2 cmH₂O')
    expect(text(wrapper, 'exam-category')).toContain('High CVP')
    expect(text(wrapper, 'exam-confidence')).toBe('Band crosses a range boundary')
    expect(text(wrapper, 'exam-elevated')).toContain('JVP elevated')
    expect(text(wrapper, 'exam-model')).toContain('Incline-adjusted offset (Seth 2002)')
  })

  it('words a column above the visible neck as a lower bound with an open band', () => {
    const wrapper = mountCard({ columnTop: 'above-neck' })

    expect(text(wrapper, 'exam-estimate-bound')).toBe('At least')
    expect(text(wrapper, 'exam-estimate-band')).toContain('9.2 cmH₂O or more')
  })

  it('words an empty vein even lying flat as an upper bound', () => {
    const wrapper = mountCard({ columnTop: 'not-filled', heightCm: null })

    expect(text(wrapper, 'exam-estimate-bound')).toBe('At most')
    expect(text(wrapper, 'exam-estimate-cmh2o')).toContain('9.7 cmH₂O')
  })

  it('when the column cannot be assessed, says there is no estimate and still shows the caution', () => {
    const wrapper = mountCard({ columnTop: 'not-assessable', heightCm: null })

    expect(text(wrapper, 'exam-estimate-bound')).toBe('Not estimable')
    expect(wrapper.find('[data-testid="exam-estimate-cmh2o"]').exists()).toBe(false)
    expect(text(wrapper, 'exam-caution')).toBe(CAUTION_TEXT)
  })

  it('always shows the caution text', () => {
    const wrapper = mountCard()

    expect(text(wrapper, 'exam-caution')).toBe(CAUTION_TEXT)
  })

  it('warns that the pulsation may be arterial when fewer than three venous signs were found', () => {
    const wrapper = mountCard({ venousSigns: ['double-peaked'] })

    expect(text(wrapper, 'exam-arterial-warning')).toContain('may be arterial')
  })

  it('lists hints as patterns to consider, never as diagnoses', () => {
    const wrapper = mountCard({ waveform: { aWave: 'cannon', vWave: 'unclear', yDescent: 'unclear' } })

    expect(text(wrapper, 'exam-hints')).toContain('Cannon a waves: consider atrioventricular dissociation')
  })

  it('notes an inclination beyond the studied range', () => {
    const wrapper = mountCard({ inclinationDeg: 75 })

    expect(wrapper.find('[data-testid="exam-outside-range"]').exists()).toBe(true)
  })

  it('the toggle shows the fixed 5 cm estimate beside the incline-adjusted one', async () => {
    const wrapper = mountCard()
    expect(wrapper.find('[data-testid="exam-other"]').exists()).toBe(false)

    await wrapper.find('[data-testid="exam-compare-toggle"] input').setValue(true)

    expect(text(wrapper, 'exam-estimate-cmh2o')).toBe('13.7 cmH₂O')
    expect(text(wrapper, 'exam-other')).toContain('Fixed 5 cm offset')
    expect(text(wrapper, 'exam-other-cmh2o')).toBe('9.0 cmH₂O')
  })
})

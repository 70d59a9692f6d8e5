import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import type { Estimate, ExamFindingsInput } from '#shared/schemas/exam'
import ExamResultCard from '@/components/exam/ExamResultCard.vue'
import { makeFindings } from '../../factories/draft'

function mountCard(overrides: Partial<ExamFindingsInput> = {}, estimate?: Estimate) {
  return mount(ExamResultCard, { props: { findings: makeFindings(overrides), estimate }, global: { plugins: [createVuetify()] } })
}

function text(wrapper: ReturnType<typeof mountCard>, testid: string) {
  return wrapper.find(`[data-testid="${testid}"]`).text()
}

const exists = (wrapper: ReturnType<typeof mountCard>, testid: string) => wrapper.find(`[data-testid="${testid}"]`).exists()

describe('ExamResultCard', () => {
  // The worked example: h 4 cm at 45°, ruler, incline-adjusted (Seth 2002 offset 9.7 cm), default terms σ 2.29 cm.
  it('shows the worked example as 13.7 cmH₂O, 10.1 mmHg, band 9.2–18.2 cmH₂O, elevated, "normal or high"', () => {
    const wrapper = mountCard()

    expect(text(wrapper, 'exam-estimate-cmh2o')).toBe('13.7 cmH₂O')
    expect(text(wrapper, 'exam-estimate-mmhg')).toBe('10.1 mmHg')
    expect(text(wrapper, 'exam-estimate-band')).toContain('9.2–18.2 cmH₂O')
    // McGee 1998 (Am Heart J 136:10–18): elevated above 3 cm; Cook 1990 categories: the band reaches normal and high.
    expect(text(wrapper, 'exam-elevated')).toBe('JVP elevated (more than 3 cm above the sternal angle)')
    expect(text(wrapper, 'exam-category')).toContain('normal or high')
    expect(text(wrapper, 'exam-confidence')).toContain('indeterminate')
    expect(text(wrapper, 'exam-model')).toContain('Incline-adjusted offset (Seth 2002)')
    expect(text(wrapper, 'exam-model')).toContain('default error term')
  })

  // 2 cm at 45°: not elevated by McGee's 3 cm rule, yet 11.7 cmH₂O with the CT-derived offset of 9.7 cm (Seth 2002).
  it('2 cm at 45° is "not elevated" with the categories "normal or high", and the frame note beside both', () => {
    const wrapper = mountCard({ heightCm: 2 })

    expect(text(wrapper, 'exam-elevated')).toContain('JVP not elevated')
    expect(text(wrapper, 'exam-category')).toContain('normal or high')
    const statements = wrapper.find('[data-testid="exam-statements"]')
    expect(statements.find('[data-testid="exam-frame-note"]').text()).toContain('the CT-derived offset is 9.7 cm')
  })

  it('with one category only, says nothing of an indeterminate range', () => {
    const wrapper = mountCard({ heightCm: 12 })

    expect(text(wrapper, 'exam-category')).toContain('high')
    expect(exists(wrapper, 'exam-confidence')).toBe(false)
  })

  it('words a column above the visible neck as a lower bound with an open band (one-sided 95%, z 1.645)', () => {
    const wrapper = mountCard({ columnTop: 'above-neck' })

    expect(text(wrapper, 'exam-estimate-bound')).toBe('At least')
    // 13.7 − 1.645 × 2.29 = 9.9 cmH₂O.
    expect(text(wrapper, 'exam-estimate-band')).toContain('9.9 cmH₂O or more')
  })

  it('words an empty vein lying flat as an upper bound at the offset (Seth 2002: 5.4 cm at 0°)', () => {
    const wrapper = mountCard({ columnTop: 'not-filled', inclinationDeg: 0, heightCm: null })

    expect(text(wrapper, 'exam-estimate-bound')).toBe('At most')
    expect(text(wrapper, 'exam-estimate-cmh2o')).toContain('5.4 cmH₂O')
    expect(text(wrapper, 'exam-elevated')).toContain('JVP not elevated')
  })

  it('when the column cannot be assessed, says there is no estimate and still shows the caution', () => {
    const wrapper = mountCard({ columnTop: 'not-assessable', notAssessableReason: 'habitus', heightCm: null })

    expect(text(wrapper, 'exam-estimate-bound')).toBe('Not estimable')
    expect(exists(wrapper, 'exam-estimate-cmh2o')).toBe(false)
    expect(text(wrapper, 'exam-caution')).toBe(CAUTION_TEXT)
  })

  it('always shows the caution, with the upright heart-failure sentence (McGee 1998)', () => {
    const wrapper = mountCard()

    expect(text(wrapper, 'exam-caution')).toBe(CAUTION_TEXT)
    expect(text(wrapper, 'exam-caution')).toContain('Upright patients with heart failure')
  })

  // Cook & Simel 1996 (JAMA 275:630–634): a palpable pulsation behaves like the carotid.
  it('puts arterial evidence first, before the number', () => {
    const wrapper = mountCard({ venousSigns: { 'not-palpable': 'absent', 'double-peaked': 'present' } })

    const html = wrapper.html()
    expect(text(wrapper, 'exam-arterial-warning')).toContain('Arterial evidence')
    expect(html.indexOf('data-testid="exam-arterial-warning"')).toBeLessThan(html.indexOf('data-testid="exam-estimate"'))
  })

  it('warns that the pulsation may be arterial when fewer venous signs than the setting were found', () => {
    const wrapper = mountCard({ venousSigns: { 'double-peaked': 'present' } })

    expect(text(wrapper, 'exam-caution-few-venous-signs')).toContain('may be arterial')
    expect(exists(wrapper, 'exam-arterial-warning')).toBe(false)
  })

  it('shows prompts in their own block, labelled as prompts from Plumbline (not findings), each with its differential', () => {
    const wrapper = mountCard({ waveform: { aWave: 'cannon', vWave: 'unclear', yDescent: 'unclear' } })

    const prompts = text(wrapper, 'exam-prompts')
    expect(prompts).toContain('Prompts from Plumbline')
    expect(prompts).toContain('not findings')
    expect(text(wrapper, 'exam-prompt-cannon-a-waves')).toContain('complete heart block; ventricular tachycardia; junctional rhythm')
  })

  it('with a sinus rhythm and no a waves, the prompt queries the contradiction', () => {
    const wrapper = mountCard({ rhythm: 'sinus', waveform: { aWave: 'absent', vWave: 'unclear', yDescent: 'unclear' } })

    expect(text(wrapper, 'exam-prompt-query')).toContain('sinus')
  })

  it('puts the left-vein caution beside the number, not among the prompts', () => {
    const wrapper = mountCard({ vein: 'left-internal' })

    expect(text(wrapper, 'exam-caution-left-sided-vein')).toContain('falsely high')
    expect(exists(wrapper, 'exam-prompts')).toBe(false)
  })

  it('notes an inclination beyond the studied range beside the number', () => {
    const wrapper = mountCard({ inclinationDeg: 75 })

    expect(text(wrapper, 'exam-caution-outside-studied-range')).toContain('60°')
  })

  // Seth 2002: 9.7 cm at 45°, so the 5 cm convention sits 4.7 cm below it.
  it('with the 5 cm convention, states its known offset difference in numbers', () => {
    const wrapper = mountCard({ offsetModel: 'fixed-5cm' })

    expect(text(wrapper, 'exam-caution-convention-offset')).toContain('4.7 cm below the CT-derived offset at 45°')
  })

  it('shows each circumstance recorded beside the result', () => {
    const wrapper = mountCard({ context: ['positive-pressure-ventilation', 'tense-ascites'] })

    expect(text(wrapper, 'exam-caution-positive-pressure-ventilation')).toContain('Positive-pressure ventilation')
    expect(text(wrapper, 'exam-caution-tense-ascites')).toContain('Tense ascites')
  })

  it('the toggle shows the fixed 5 cm estimate beside the incline-adjusted one', async () => {
    const wrapper = mountCard()
    expect(exists(wrapper, 'exam-other')).toBe(false)

    await wrapper.find('[data-testid="exam-compare-toggle"] input').setValue(true)

    expect(text(wrapper, 'exam-estimate-cmh2o')).toBe('13.7 cmH₂O')
    expect(text(wrapper, 'exam-other')).toContain('Fixed 5 cm offset')
    expect(text(wrapper, 'exam-other-cmh2o')).toBe('9.0 cmH₂O')
  })
})

import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createVuetify } from 'vuetify'
import { db } from '@/db'
import { useExamDraftStore } from '@/stores/exam-draft'
import type { DraftFields } from '@/db/draft-schema'
import BedsideFlow from '@/components/bedside/BedsideFlow.vue'
import { WORKED_EXAMPLE } from '../../factories/draft'

vi.mock('@/api/exams', () => ({ createExam: vi.fn() }))

const TEAMS = [{ id: 't-1', name: 'Cardiology A' }]
let pinia: Pinia

async function mountFlowAt(step: number, fields: DraftFields) {
  const store = useExamDraftStore()
  await store.startNew(TEAMS)
  store.update(fields)
  await store.goTo(step)
  const wrapper = mount(BedsideFlow, { props: { teams: TEAMS }, global: { plugins: [createVuetify(), pinia] } })
  await flushPromises()
  return { store, wrapper }
}

describe('BedsideFlow', () => {
  beforeEach(async () => {
    pinia = createPinia()
    setActivePinia(pinia)
    await db.drafts.clear()
  })

  it('on the height step, Next with the column seen but no height stays put and asks for the height', async () => {
    const { store, wrapper } = await mountFlowAt(2, { ...WORKED_EXAMPLE, heightCm: null })

    await wrapper.find('[data-testid="step-next"]').trigger('click')
    await flushPromises()

    expect(store.step).toBe(2)
    expect(wrapper.find('[data-testid="height-cm"]').text()).toContain('Enter the height of the column top above the sternal angle')
    expect(store.draft?.fields.columnTop).toBe('seen')
  })

  it('on the height step, Next with a height moves on to the waveform', async () => {
    const { store, wrapper } = await mountFlowAt(2, WORKED_EXAMPLE)

    await wrapper.find('[data-testid="step-next"]').trigger('click')
    await flushPromises()

    expect(store.step).toBe(3)
    expect(wrapper.find('[data-testid="step-title"]').text()).toBe('Waveform and manoeuvres')
  })

  it('shows no live CVP chip on the first two steps', async () => {
    const { wrapper } = await mountFlowAt(1, WORKED_EXAMPLE)

    expect(wrapper.find('[data-testid="live-cvp"]').exists()).toBe(false)
  })

  it('from the height step on, shows the live CVP, updated as the height changes', async () => {
    const { store, wrapper } = await mountFlowAt(2, WORKED_EXAMPLE)
    expect(wrapper.find('[data-testid="live-cvp"]').text()).toContain('13.7 cmH₂O')

    store.update({ heightCm: 6 })
    await flushPromises()

    expect(wrapper.find('[data-testid="live-cvp"]').text()).toContain('15.7 cmH₂O')
  })

  it('the review shows the result card and the save button', async () => {
    const { wrapper } = await mountFlowAt(4, WORKED_EXAMPLE)

    expect(wrapper.find('[data-testid="exam-estimate-cmh2o"]').text()).toBe('13.7 cmH₂O')
    expect(wrapper.find('[data-testid="save-exam"]').exists()).toBe(true)
  })

  it('Back returns to the previous step without losing what was typed', async () => {
    const { store, wrapper } = await mountFlowAt(3, WORKED_EXAMPLE)

    await wrapper.find('[data-testid="step-back"]').trigger('click')
    await flushPromises()

    expect(store.step).toBe(2)
    expect(wrapper.find<HTMLInputElement>('[data-testid="height-cm"] input').element.value).toBe('4')
  })

  it('with a palpable pulsation, the review asks to confirm the column is venous and shows the refusal on that field', async () => {
    const { store, wrapper } = await mountFlowAt(4, { ...WORKED_EXAMPLE, venousSigns: { ...WORKED_EXAMPLE.venousSigns, 'not-palpable': 'absent' } })

    await wrapper.find('[data-testid="save-exam"]').trigger('click')
    await flushPromises()

    expect(store.step).toBe(4)
    expect(wrapper.find('[data-testid="exam-arterial-warning"]').text()).toContain('Arterial evidence')
    expect(wrapper.find('[data-testid="venous-confirm"]').text()).toContain('I confirm the column is venous')
    expect(wrapper.find('[data-testid="venous-confirm"]').text()).toContain('confirm that the column you measured is venous')
    expect(wrapper.find('[data-testid="review-incomplete"]').exists()).toBe(false)
  })

  it('without arterial evidence, the review asks no confirmation', async () => {
    const { wrapper } = await mountFlowAt(4, WORKED_EXAMPLE)

    expect(wrapper.find('[data-testid="venous-confirm"]').exists()).toBe(false)
  })

  it('circumstances ticked on the manoeuvres step are shown beside the result at review', async () => {
    const { store, wrapper } = await mountFlowAt(3, WORKED_EXAMPLE)

    await wrapper.find('[data-testid="context-tense-ascites"] input').setValue(true)
    await store.goTo(4)
    await flushPromises()

    expect(store.draft?.fields.context).toEqual(['tense-ascites'])
    expect(wrapper.find('[data-testid="exam-caution-tense-ascites"]').text()).toContain('Tense ascites')
  })

  it('the band on the review step is the live estimate’s, the one sent as reviewed', async () => {
    const { store, wrapper } = await mountFlowAt(4, WORKED_EXAMPLE)

    const [low, high] = store.estimate!.bandCmH2O!

    expect(wrapper.find('[data-testid="exam-estimate-band"]').text()).toContain(`${low!.toFixed(1)}–${high!.toFixed(1)} cmH₂O`)
  })
})

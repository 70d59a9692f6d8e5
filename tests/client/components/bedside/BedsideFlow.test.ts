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
})

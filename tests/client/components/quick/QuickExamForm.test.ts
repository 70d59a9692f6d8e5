import { beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createVuetify } from 'vuetify'
import { db } from '@/db'
import { useExamDraftStore } from '@/stores/exam-draft'
import { useSessionStore } from '@/stores/session'
import type { DraftFields } from '@/db/draft-schema'
import QuickExamForm from '@/components/quick/QuickExamForm.vue'
import { WORKED_EXAMPLE } from '../../factories/draft'
import { makeUser } from '../../factories/user'

vi.mock('@/api/exams', () => ({ createExam: vi.fn(), submitExam: vi.fn() }))
vi.mock('@/api/sync', () => ({ pushChanges: vi.fn(), pullChanges: vi.fn() }))

const TEAMS = [{ id: 't-1', name: 'Cardiology A' }]
let pinia: Pinia

async function mountQuick(fields: DraftFields) {
  const store = useExamDraftStore()
  await store.startNew(TEAMS)
  store.update(fields)
  const wrapper = mount(QuickExamForm, { props: { teams: TEAMS }, global: { plugins: [createVuetify(), pinia] } })
  await flushPromises()
  return { store, wrapper }
}

const sign = (wrapper: Awaited<ReturnType<typeof mountQuick>>['wrapper'], name: string) =>
  wrapper.find(`[data-testid="quick-sign-${name}"]`)

describe('QuickExamForm', () => {
  beforeEach(async () => {
    pinia = createPinia()
    setActivePinia(pinia)
    localStorage.clear()
    useSessionStore().user = makeUser({ id: 'u-1' })
    await db.drafts.clear()
  })

  it('shows every field of an ordinary exam on one screen, the right internal jugular preselected', async () => {
    const { wrapper } = await mountQuick({})

    for (const id of [
      'patient-code',
      'team',
      'inclination-input',
      'inclination-measure',
      'vein',
      'quick-column-top',
      'quick-signs',
      'quick-save-submit',
      'quick-save-draft',
    ]) {
      expect(wrapper.find(`[data-testid="${id}"]`).exists(), id).toBe(true)
    }
    expect(wrapper.find('[data-testid="vein"]').text()).toContain('Right internal jugular')
  })

  it('a sign moves on with each tap: not checked, yes, no, and back to not checked', async () => {
    const { store, wrapper } = await mountQuick({})

    const states: unknown[] = []
    for (let tap = 0; tap < 3; tap += 1) {
      await sign(wrapper, 'double-peaked').trigger('click')
      states.push(store.draft?.fields.venousSigns?.['double-peaked'])
    }

    expect(states).toEqual(['present', 'absent', 'not-tested'])
    expect(sign(wrapper, 'double-peaked').attributes('aria-label')).toBe('Two peaks: not checked')
  })

  it('with the findings complete, shows the live estimate in cmH₂O and mmHg with its band and the caution', async () => {
    const { wrapper } = await mountQuick(WORKED_EXAMPLE)

    expect(wrapper.find('[data-testid="exam-estimate-cmh2o"]').text()).toContain('13.7 cmH₂O')
    expect(wrapper.find('[data-testid="exam-estimate-mmhg"]').text()).toContain('10.1 mmHg')
    expect(wrapper.find('[data-testid="exam-estimate-band"]').text()).toMatch(/\d+\.\d–\d+\.\d cmH₂O/)
    expect(wrapper.find('[data-testid="exam-caution"]').exists()).toBe(true)
  })

  it('"all normal" records the waveform and breathing as normal, and a second tap takes it back', async () => {
    const { store, wrapper } = await mountQuick(WORKED_EXAMPLE)

    await wrapper.find('[data-testid="quick-all-normal"] input').setValue(true)
    const normal = { waveform: store.draft?.fields.waveform, respiratory: store.draft?.fields.respiratory }
    await wrapper.find('[data-testid="quick-all-normal"] input').setValue(false)

    expect(normal).toEqual({ waveform: { aWave: 'normal', vWave: 'normal', yDescent: 'normal' }, respiratory: 'falls-on-inspiration' })
    expect(store.draft?.fields.respiratory).toBe('not-assessed')
  })

  it('Save and submit with a palpable pulsation unconfirmed shows the confirmation beside the signs and sends nothing', async () => {
    const { store, wrapper } = await mountQuick({
      ...WORKED_EXAMPLE,
      venousSigns: { ...WORKED_EXAMPLE.venousSigns, 'not-palpable': 'absent' },
    })

    await wrapper.find('[data-testid="quick-save-submit"]').trigger('click')
    await flushPromises()

    const signs = wrapper.find('[data-testid="quick-signs"]')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="save-notice"]').exists()).toBe(true))
    expect(signs.find('[data-testid="venous-confirm-checkbox"]').text()).toMatch(/confirm that the column you measured is venous/)
    expect(store.draft?.state).toBe('editing')
  })

  it('Save and submit with the height missing marks the height field', async () => {
    const { wrapper } = await mountQuick({ ...WORKED_EXAMPLE, heightCm: null })

    await wrapper.find('[data-testid="quick-save-submit"]').trigger('click')
    await flushPromises()

    await vi.waitFor(() => expect(wrapper.find('[data-testid="save-notice"]').text()).toContain('Some answers need attention'))
    expect(wrapper.find('[data-testid="height-cm"]').text()).toContain('Enter the height of the column top above the sternal angle')
  })

  it('an error in a folded field opens the panel that holds it', async () => {
    const { wrapper } = await mountQuick({ ...WORKED_EXAMPLE, notes: 'x'.repeat(2001) })

    await wrapper.find('[data-testid="quick-save-submit"]').trigger('click')
    await flushPromises()

    await vi.waitFor(() => expect(wrapper.find('[data-testid="notes"]').exists()).toBe(true))
    expect(wrapper.find('[data-testid="notes"]').classes()).toContain('v-input--error')
  })
})

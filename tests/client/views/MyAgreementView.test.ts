import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { Line } from 'vue-chartjs'
import type { ChartData } from 'chart.js'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { FEEDBACK_LABEL } from '#shared/domain/feedback-text'
import type { Role } from '#shared/schemas/user'
import MyAgreementView from '@/views/MyAgreementView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as loop from '@/api/loop'
import * as teamsApi from '@/api/teams'
import { makeMyAgreement } from '../factories/loop'
import { makeUser } from '../factories/user'

vi.mock('@/api/loop')
vi.mock('@/api/teams', () => ({ fetchTeams: vi.fn() }))

async function mountView(roles: Role[]) {
  useSessionStore().user = makeUser({ roles })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'my-agreement' })
  const wrapper = mount(MyAgreementView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

describe('MyAgreementView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(loop.fetchMyAgreement).mockReset().mockResolvedValue(makeMyAgreement())
    vi.mocked(teamsApi.fetchTeams)
      .mockReset()
      .mockResolvedValue([
        {
          id: 't-1',
          name: 'Ward 7 North',
          members: [
            { id: 'res-2', displayName: 'Dr Ada Park', roles: ['resident'] },
            { id: 'att-1', displayName: 'Dr Tomas Lindqvist', roles: ['attending'] },
          ],
        },
      ])
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it("a resident sees their own bias, mean |difference|, cases, the learning curve and the feedback they received", async () => {
    const wrapper = await mountView(['resident'])

    expect(loop.fetchMyAgreement).toHaveBeenCalledWith(undefined)
    expect(wrapper.find('[data-testid="learning-caution"]').text()).toBe(CAUTION_TEXT)
    expect(wrapper.find('[data-testid="learning-n"]').text()).toBe('23')
    expect(wrapper.find('[data-testid="learning-bias"]').text()).toBe('+1.4 cmH₂O')
    expect(wrapper.find('[data-testid="learning-mean-abs"]').text()).toBe('2.3 cmH₂O')
    expect(wrapper.findAll('[data-testid="learning-block-mean"]').map((td) => td.text())).toEqual(['3.1', '1.9', '1.2'])
    const curve = wrapper.findComponent(Line).props('data') as ChartData<'line'>
    expect(curve.labels).toEqual(['1–10', '11–20', '21–23'])
    expect(wrapper.find('[data-testid="learning-curve-caption"]').text()).toContain('went from 3.1 to 1.2 cmH₂O')
    const feedback = wrapper.find('[data-testid="learning-feedback-item"]').text()
    expect(feedback).toContain(FEEDBACK_LABEL['read-peak-not-mean'])
    expect(feedback).toContain('Use the bed lever, not pillows.')
    expect(feedback).toContain('+2.6 cmH₂O')
  })

  it('an attending chooses a resident of their teams and sees that resident’s agreement', async () => {
    const wrapper = await mountView(['attending'])
    expect(loop.fetchMyAgreement).not.toHaveBeenCalled()

    const select = wrapper.findAllComponents({ name: 'VSelect' }).find((s) => s.attributes('data-testid') === 'learning-resident')!
    expect((select.props('items') as { title: string }[]).map((i) => i.title)).toEqual(['Dr Ada Park'])
    await select.setValue('res-2')
    await flushPromises()

    expect(loop.fetchMyAgreement).toHaveBeenCalledWith('res-2')
    expect(wrapper.find('[data-testid="learning-n"]').text()).toBe('23')
  })
})

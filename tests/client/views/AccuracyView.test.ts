import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { Scatter } from 'vue-chartjs'
import type { ChartData } from 'chart.js'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import AccuracyView from '@/views/AccuracyView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as loop from '@/api/loop'
import * as teamsApi from '@/api/teams'
import { makeAccuracy, makeAccuracyPoint } from '../factories/loop'
import { makeUser } from '../factories/user'

vi.mock('@/api/loop')
vi.mock('@/api/teams', () => ({ fetchTeams: vi.fn() }))

async function mountView() {
  useSessionStore().user = makeUser({ roles: ['educator'], teams: [] })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'accuracy' })
  const wrapper = mount(AccuracyView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

function chooseIn(wrapper: VueWrapper, testId: string, value: string) {
  const select = wrapper.findAllComponents({ name: 'VSelect' }).find((s) => s.attributes('data-testid') === testId)!
  return select.setValue(value)
}

const plotData = (wrapper: VueWrapper, testid: string) =>
  wrapper.find(`[data-testid="${testid}"]`).findComponent(Scatter).props('data') as ChartData<'scatter'>

describe('AccuracyView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(loop.fetchAccuracy).mockReset().mockResolvedValue(makeAccuracy())
    vi.mocked(teamsApi.fetchTeams).mockReset().mockResolvedValue([{ id: 't-ward', name: 'Ward 7 North — Cardiology', members: [] }])
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('shows the caution, the coverage in words, the figures and both plots', async () => {
    const wrapper = await mountView()

    expect(wrapper.find('[data-testid="accuracy-caution"]').text()).toBe(CAUTION_TEXT)
    expect(wrapper.find('[data-testid="accuracy-coverage"]').text()).toContain('in 41 of 50 exams: narrower than it should be')
    expect(wrapper.find('[data-testid="accuracy-bias"]').text()).toBe('+1.2 cmH₂O')
    expect(wrapper.find('[data-testid="accuracy-loa"]').text()).toBe('−3.7 to +6.1 cmH₂O')
    expect(wrapper.find('[data-testid="calibration-plot"] canvas').exists()).toBe(true)
    expect(wrapper.find('[data-testid="accuracy-bland-altman"] canvas').exists()).toBe(true)
  })

  it('plots estimate against measured with the identity line, and the band misses apart', async () => {
    vi.mocked(loop.fetchAccuracy).mockResolvedValue(makeAccuracy({ points: [makeAccuracyPoint(10, 8), makeAccuracyPoint(14, 7.5)] }))

    const wrapper = await mountView()

    const sets = plotData(wrapper, 'calibration-plot').datasets
    expect(sets[0]!.data).toEqual([{ x: 8, y: 10 }])
    expect(sets[1]!.data).toEqual([{ x: 7.5, y: 14 }])
    expect(sets[2]!.data).toEqual([
      { x: 7.5, y: 7.5 },
      { x: 14, y: 14 },
    ])
    expect(wrapper.find('[data-testid="calibration-plot-caption"]').text()).toContain('2 lie above it')
  })

  it('draws the Bland–Altman plot of estimate − measured against their mean, leaving bounds out', async () => {
    const bound = makeAccuracyPoint(16, 20, { bound: 'lower', band: [12, null], inside: true })
    vi.mocked(loop.fetchAccuracy).mockResolvedValue(makeAccuracy({ points: [makeAccuracyPoint(10, 8), bound] }))

    const wrapper = await mountView()

    const sets = plotData(wrapper, 'accuracy-bland-altman').datasets
    expect(sets[0]!.data).toEqual([{ x: 9, y: 2 }])
    expect(sets.map((s) => s.label)).toContain('Bias (+1.2 cmH₂O)')
  })

  it('sends the chosen team, kind and start day to the server', async () => {
    const wrapper = await mountView()

    await chooseIn(wrapper, 'accuracy-filter-team', 't-ward')
    await chooseIn(wrapper, 'accuracy-filter-kind', 'echo-ra')
    await wrapper.find('[data-testid="accuracy-filter-from"] input').setValue('2026-03-01')
    await flushPromises()

    expect(vi.mocked(loop.fetchAccuracy).mock.lastCall![0]).toEqual({
      from: new Date('2026-03-01T00:00:00').toISOString(),
      to: undefined,
      teamId: 't-ward',
      kind: 'echo-ra',
    })
  })
})

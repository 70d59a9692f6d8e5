import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import RoundDetailView from '@/views/RoundDetailView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as roundsApi from '@/api/rounds'
import { makeUser } from '../factories/user'
import { makeResults, makeRound } from './RoundFixtures'

vi.mock('@/api/rounds')

async function mountDetail(userId = 'edu-1') {
  useSessionStore().user = makeUser({ id: userId, roles: ['educator'] })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'round-detail', params: { id: 'round-1' } })
  const wrapper = mount(RoundDetailView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

describe('RoundDetailView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(roundsApi.fetchRound).mockReset()
    vi.mocked(roundsApi.fetchRoundResults).mockReset()
    vi.mocked(roundsApi.closeRound).mockReset()
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('an open round shows the progress grid without values, the blinding note, and no results', async () => {
    const round = makeRound({ canClose: true, recorded: 1 })
    round.entries[0] = { ...round.entries[0]!, state: 'recorded' }
    vi.mocked(roundsApi.fetchRound).mockResolvedValue(round)

    const wrapper = await mountDetail()

    expect(wrapper.find('[data-testid="round-title"]').text()).toBe('Ward 7 North calibration')
    expect(wrapper.findAll('[data-testid="round-cell-recorded"]')).toHaveLength(1)
    expect(wrapper.findAll('[data-testid="round-cell-missing"]')).toHaveLength(3)
    expect(wrapper.find('[data-testid="round-cell-height"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="round-blinding-note"]').text()).toContain('stay hidden')
    expect(wrapper.find('[data-testid="round-results"]').exists()).toBe(false)
    expect(roundsApi.fetchRoundResults).not.toHaveBeenCalled()
  })

  it('a closed round shows the ICC with its CI, Fleiss’ kappa with its label, the bias table, the missing entries and the caution', async () => {
    vi.mocked(roundsApi.fetchRound).mockResolvedValue(makeRound({ status: 'closed', closedAt: '2026-11-25T09:00:00.000Z' }))
    vi.mocked(roundsApi.fetchRoundResults).mockResolvedValue(makeResults())

    const wrapper = await mountDetail()

    expect(wrapper.find('[data-testid="round-icc-value"]').text()).toBe('0.71')
    expect(wrapper.find('[data-testid="round-icc"]').text()).toContain('95% CI 0.23 to 0.95')
    expect(wrapper.find('[data-testid="round-kappa-value"]').text()).toBe('0.46')
    expect(wrapper.find('[data-testid="round-kappa-label"]').text()).toContain('moderate')
    const rows = wrapper.findAll('[data-testid="round-bias-row"]').map((r) => r.text())
    expect(rows[0]).toContain('Dr Sam Whitcombe')
    expect(rows[0]).toContain('−0.8')
    expect(rows[1]).toContain('+0.8')
    expect(wrapper.find('[data-testid="round-missing-count"]').text()).toContain('1 entry is missing')
    expect(wrapper.find('[data-testid="round-missing-list"]').text()).toContain('SM-0312 — Dr Aiko Brennan')
    expect(wrapper.find('[data-testid="exam-caution"]').text()).toBe(CAUTION_TEXT)
  })

  it('a statistic the server could not compute shows its reason, never NaN', async () => {
    vi.mocked(roundsApi.fetchRound).mockResolvedValue(makeRound({ status: 'closed' }))
    vi.mocked(roundsApi.fetchRoundResults).mockResolvedValue(
      makeResults({ icc: { unavailable: 'All ratings are identical' }, fleissElevated: { unavailable: 'All ratings fall in a single category' } }),
    )

    const wrapper = await mountDetail()

    expect(wrapper.find('[data-testid="round-icc-unavailable"]').text()).toContain('All ratings are identical')
    expect(wrapper.find('[data-testid="round-kappa-unavailable"]').text()).toContain('single category')
    expect(wrapper.text()).not.toContain('NaN')
  })

  it('its educator closes it after confirming; the results then appear', async () => {
    vi.mocked(roundsApi.fetchRound).mockResolvedValue(makeRound({ canClose: true }))
    vi.mocked(roundsApi.closeRound).mockResolvedValue(makeRound({ status: 'closed', closedAt: '2026-11-25T09:00:00.000Z' }))
    vi.mocked(roundsApi.fetchRoundResults).mockResolvedValue(makeResults())
    const wrapper = await mountDetail()

    await wrapper.find('[data-testid="round-close"]').trigger('click')
    await flushPromises()
    ;(document.querySelector('[data-testid="round-close-confirm"]') as HTMLElement).click()
    await flushPromises()

    expect(roundsApi.closeRound).toHaveBeenCalledWith('round-1')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="round-icc-value"]').exists()).toBe(true))
    expect(wrapper.find('[data-testid="round-status"]').text()).toBe('Closed')
    expect(wrapper.find('[data-testid="round-close"]').exists()).toBe(false)
  })

  it('to its educator the codes arrive as pseudonyms: the grid and the missing entries show them, with a note saying so', async () => {
    const codes = ['P-1a2b3c4d', 'P-5e6f7a8b']
    vi.mocked(roundsApi.fetchRound).mockResolvedValue(makeRound({ status: 'closed', patientCodes: codes, codesMasked: true }))
    vi.mocked(roundsApi.fetchRoundResults).mockResolvedValue(
      makeResults({
        patientCodes: codes,
        incompleteCodes: [codes[1]!],
        missing: { count: 1, entries: [{ examinerId: 'ex-2', examinerName: 'Dr Aiko Brennan', patientCode: codes[1]!, reason: 'not-recorded' }] },
        codesMasked: true,
      }),
    )

    const wrapper = await mountDetail()

    expect(wrapper.find('[data-testid="round-codes-masked-note"]').text()).toContain('masked')
    expect(wrapper.find('[data-testid="round-grid"]').text()).toContain('P-1a2b3c4d')
    expect(wrapper.find('[data-testid="round-missing-list"]').text()).toContain('P-5e6f7a8b — Dr Aiko Brennan')
  })

  it('an examiner (real codes) sees no note about masking', async () => {
    vi.mocked(roundsApi.fetchRound).mockResolvedValue(makeRound({ isExaminer: true, codesMasked: false }))

    const wrapper = await mountDetail('ex-1')

    expect(wrapper.find('[data-testid="round-grid"]').text()).toContain('SM-0311')
    expect(wrapper.find('[data-testid="round-codes-masked-note"]').exists()).toBe(false)
  })

  it('an examiner who may not close it is not offered the button', async () => {
    vi.mocked(roundsApi.fetchRound).mockResolvedValue(makeRound({ isExaminer: true }))

    const wrapper = await mountDetail('ex-1')

    expect(wrapper.find('[data-testid="round-close"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="round-blinding-note"]').text()).toContain('choosing this round')
  })
})

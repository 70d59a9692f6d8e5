import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import RoundsView from '@/views/RoundsView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as roundsApi from '@/api/rounds'
import * as teamsApi from '@/api/teams'
import type { Role } from '#shared/schemas/user'
import { makeUser } from '../factories/user'
import { httpError } from '../factories/http-error'
import { makeRound } from './RoundFixtures'

vi.mock('@/api/rounds')
vi.mock('@/api/teams')

const TEAMS = [
  {
    id: 't-1',
    name: 'Ward 7 North — Cardiology',
    members: [
      { id: 'ex-1', displayName: 'Dr Sam Whitcombe', roles: ['resident' as const] },
      { id: 'ex-2', displayName: 'Dr Aiko Brennan', roles: ['resident' as const] },
      { id: 'edu-2', displayName: 'Dr Other Educator', roles: ['educator' as const] },
    ],
  },
]

async function mountAs(roles: Role[]) {
  useSessionStore().user = makeUser({ id: roles.includes('educator') ? 'edu-1' : 'ex-1', roles })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'rounds' })
  const wrapper = mount(RoundsView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return { wrapper, router }
}

describe('RoundsView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(roundsApi.fetchRounds).mockReset()
    vi.mocked(roundsApi.createRound).mockReset()
    vi.mocked(teamsApi.fetchTeams).mockResolvedValue(TEAMS)
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('lists the rounds with their status and progress; a click opens the round', async () => {
    const open = makeRound({ id: 'r-open', name: 'November round', recorded: 3 })
    const closed = makeRound({ id: 'r-closed', name: 'October round', status: 'closed', recorded: 4 })
    vi.mocked(roundsApi.fetchRounds).mockResolvedValue([open, closed])
    const { wrapper, router } = await mountAs(['educator'])
    const push = vi.spyOn(router, 'push').mockResolvedValue(undefined)

    const items = wrapper.findAll('[data-testid^="round-item-"]')
    await items[0]!.trigger('click')

    expect(items.map((i) => i.text())).toEqual([expect.stringContaining('November round'), expect.stringContaining('October round')])
    expect(items[0]!.text()).toContain('3 of 4 entries')
    expect(items[0]!.find('[data-testid="round-status-open"]').exists()).toBe(true)
    expect(items[1]!.find('[data-testid="round-status-closed"]').exists()).toBe(true)
    expect(push).toHaveBeenCalledWith({ name: 'round-detail', params: { id: 'r-open' } })
  })

  it('offers “New round” to educators only', async () => {
    vi.mocked(roundsApi.fetchRounds).mockResolvedValue([])

    const educator = await mountAs(['educator'])
    const educatorHasButton = educator.wrapper.find('[data-testid="round-new"]').exists()
    educator.wrapper.unmount()
    const resident = await mountAs(['resident'])

    expect(educatorHasButton).toBe(true)
    expect(resident.wrapper.find('[data-testid="round-new"]').exists()).toBe(false)
    expect(resident.wrapper.find('[data-testid="rounds-empty"]').text()).toContain('not part of any calibration round')
  })

  it('the create dialog checks the fields before sending: two examiners and a code are needed', async () => {
    vi.mocked(roundsApi.fetchRounds).mockResolvedValue([])
    const { wrapper } = await mountAs(['educator'])

    await wrapper.find('[data-testid="round-new"]').trigger('click')
    await flushPromises()
    await vi.waitFor(() => expect(document.querySelector('[data-testid="round-create-submit"]')).not.toBeNull())
    ;(document.querySelector('[data-testid="round-create-submit"]') as HTMLElement).click()
    await flushPromises()

    const dialog = document.querySelector('[data-testid="round-create-dialog"]')!.textContent!
    expect(document.querySelector('[data-testid="round-codes-masked-help"]')!.textContent).toMatch(/Once the round is saved, you see its patient codes masked/)
    expect(dialog).toContain('Name the round')
    expect(dialog).toContain('Name at least one patient code')
    expect(dialog).toContain('at least two examiners')
    expect(roundsApi.createRound).not.toHaveBeenCalled()
  })

  it('shows the server’s field errors under the field they concern, naming the code at fault', async () => {
    vi.mocked(roundsApi.fetchRounds).mockResolvedValue([])
    vi.mocked(roundsApi.createRound).mockRejectedValue(
      httpError(400, 'invalid-input', 'Some fields need attention', { 'examinerIds.1': 'Dr Aiko Brennan does not record exams' }),
    )
    const { wrapper } = await mountAs(['educator'])
    await wrapper.find('[data-testid="round-new"]').trigger('click')
    await flushPromises()
    const dialog = wrapper.findComponent({ name: 'RoundCreateDialog' })

    const setup = (dialog.vm as unknown as { $: { setupState: Record<string, { value: unknown } | unknown> } }).$.setupState
    setup.name = 'Round'
    setup.patientCodes = ['SM-0311']
    setup.examinerIds = ['ex-1', 'ex-2']
    ;(document.querySelector('[data-testid="round-create-submit"]') as HTMLElement).click()
    await flushPromises()

    expect(roundsApi.createRound).toHaveBeenCalledWith({ name: 'Round', patientCodes: ['SM-0311'], examinerIds: ['ex-1', 'ex-2'] })
    await vi.waitFor(() =>
      expect(document.querySelector('[data-testid="round-examiners"]')!.textContent).toContain('Dr Aiko Brennan: Dr Aiko Brennan does not record exams'),
    )
  })
})

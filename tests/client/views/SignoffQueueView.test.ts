import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import type { SignoffQueueItem } from '#shared/schemas/signoff-queue'
import SignoffQueueView from '@/views/SignoffQueueView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as supervision from '@/api/supervision'
import { makeExam } from '../components/exam/make-exam'
import { makeUser } from '../factories/user'

vi.mock('@/api/supervision')
vi.mock('@/api/exams', () => ({ fetchExam: vi.fn(), fetchExams: vi.fn(), submitExam: vi.fn(), updateExam: vi.fn(), createExam: vi.fn() }))

const HOUR = 3600

function queueOf(items: SignoffQueueItem[], total = items.length) {
  return { items, total, page: 1, pageSize: 25, totalCapped: false, nextCursor: null }
}

async function mountQueue() {
  useSessionStore().user = makeUser({ id: 'att-1', roles: ['attending'] })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'signoff-queue' })
  const wrapper = mount(SignoffQueueView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return { wrapper, router }
}

describe('SignoffQueueView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(supervision.fetchSignoffQueue).mockReset()
    vi.mocked(supervision.fetchSignoffResidents).mockReset().mockResolvedValue([])
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('lists the waiting exams oldest first, as the server orders them, with their waiting time', async () => {
    const oldest = { exam: makeExam({ patientCode: 'SM-0001', status: 'submitted' }), waitingSeconds: 2 * 24 * HOUR + 3 * HOUR }
    const newest = { exam: makeExam({ patientCode: 'SM-0002', status: 'submitted' }), waitingSeconds: 20 * 60 }
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([oldest, newest]))

    const { wrapper } = await mountQueue()

    const rows = wrapper.findAll('[data-testid="signoff-table"] tbody tr')
    expect(rows.map((row) => row.text().match(/SM-\d+/)?.[0])).toEqual(['SM-0001', 'SM-0002'])
    expect(rows[0]!.find('[data-testid="signoff-waiting"]').text()).toBe('2 d 3 h')
    expect(rows[1]!.find('[data-testid="signoff-waiting"]').text()).toBe('20 min')
  })

  it('shows the resident, the patient code, the height and the estimate with its band', async () => {
    const item = { exam: makeExam({ examinerName: 'Dr Sam Whitcombe', status: 'submitted' }), waitingSeconds: 60 }
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([item]))

    const { wrapper } = await mountQueue()

    const row = wrapper.find('[data-testid="signoff-table"] tbody tr').text()
    expect(row).toContain('Dr Sam Whitcombe')
    expect(row).toContain('SM-0142')
    expect(row).toContain('4.0')
    expect(row).toContain('13.7 (9.2–18.2)')
  })

  it('flags an exam that has waited a day or more', async () => {
    const item = { exam: makeExam({ status: 'submitted' }), waitingSeconds: 30 * HOUR }
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([item]))

    const { wrapper } = await mountQueue()

    expect(wrapper.find('[data-testid="signoff-waiting"]').classes()).toContain('text-warning')
  })

  it('when a row is clicked, opens the review of that exam', async () => {
    const item = { exam: makeExam({ status: 'submitted' }), waitingSeconds: 60 }
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([item]))
    const { wrapper, router } = await mountQueue()
    const push = vi.spyOn(router, 'push').mockResolvedValue(undefined)

    await wrapper.find('[data-testid="signoff-table"] tbody tr').trigger('click')

    expect(push).toHaveBeenCalledWith({ name: 'exam-review', params: { id: item.exam.id } })
  })

  it('when nothing waits, says so', async () => {
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([]))

    const { wrapper } = await mountQueue()

    expect(wrapper.find('[data-testid="signoff-empty"]').text()).toContain('Nothing is waiting')
  })

  it('when “Newest first” is chosen, asks the server for the newest first, from the first page', async () => {
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([]))
    const { wrapper } = await mountQueue()

    const newest = wrapper.findAll('[data-testid="signoff-order"] button').find((b) => b.text() === 'Newest first')!
    await newest.trigger('click')
    await flushPromises()

    expect(vi.mocked(supervision.fetchSignoffQueue).mock.lastCall![0]).toMatchObject({ order: 'newest', page: 1 })
  })

  it('when a search is submitted, asks for the exams matching it and says so when none does', async () => {
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([]))
    const { wrapper } = await mountQueue()

    await wrapper.find('[data-testid="signoff-search"] input').setValue('  okafor ')
    await wrapper.find('form[role="search"]').trigger('submit')
    await flushPromises()

    expect(vi.mocked(supervision.fetchSignoffQueue).mock.lastCall![0]).toMatchObject({ q: 'okafor' })
    expect(wrapper.find('[data-testid="signoff-empty"]').text()).toContain('No waiting exam matches')
  })

  it('shows each resident with how many exams wait, and choosing one lists only theirs', async () => {
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([]))
    vi.mocked(supervision.fetchSignoffResidents).mockResolvedValue([
      { residentId: 'res-1', name: 'Dr Ayo Okafor', count: 3 },
      { residentId: 'res-2', name: 'Dr Sam Whitcombe', count: 1 },
    ])
    const { wrapper } = await mountQueue()

    const chips = wrapper.findAll('[data-testid="signoff-resident"]')
    expect(chips.map((c) => c.text().replace(/\s+/g, ' '))).toEqual(['Dr Ayo Okafor 3', 'Dr Sam Whitcombe 1'])
    await chips[0]!.trigger('click')
    await flushPromises()

    expect(vi.mocked(supervision.fetchSignoffQueue).mock.lastCall![0]).toMatchObject({ residentId: 'res-1', page: 1 })
  })

  it('carries the caution beside the list', async () => {
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue(queueOf([]))

    const { wrapper } = await mountQueue()

    expect(wrapper.find('[data-testid="caution-note"]').text()).toContain('wide error band')
  })
})

import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import type { User } from '#shared/schemas/user'
import HomeView from '@/views/HomeView.vue'
import { routes } from '@/router/routes'
import { saveDraft } from '@/db/drafts'
import { saveLastSync } from '@/db/meta'
import { wipeLocalData } from '@/db/wipe'
import { useSessionStore } from '@/stores/session'
import * as supervision from '@/api/supervision'
import { makeExam } from '../components/exam/make-exam'
import { makeDraft } from '../factories/draft'
import { makeUser } from '../factories/user'

vi.mock('@/api/supervision')
vi.mock('@/api/exams', () => ({ fetchExam: vi.fn(), fetchExams: vi.fn(), submitExam: vi.fn(), updateExam: vi.fn(), createExam: vi.fn() }))

const HOUR = 3600

async function mountHome(user: User) {
  useSessionStore().user = user
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'home' })
  const wrapper = mount(HomeView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  await flushPromises()
  return wrapper
}

/** The hrefs and texts of a section's list items. */
function linksIn(wrapper: Awaited<ReturnType<typeof mountHome>>, testid: string) {
  return wrapper.findAll(`[data-testid="${testid}"] ul > li a`).map((a) => ({ href: a.attributes('href'), text: a.text() }))
}

describe('HomeView as a work list', () => {
  beforeEach(async () => {
    await wipeLocalData()
    setActivePinia(createPinia())
    vi.resetAllMocks()
    vi.mocked(supervision.fetchReturnedExams).mockResolvedValue([])
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue({
      items: [],
      total: 0,
      page: 1,
      pageSize: 3,
      totalCapped: false,
      nextCursor: null,
    })
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('lists this device’s unfinished drafts, each linking to its recording', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0007' }, { id: 'draft-1', step: 2 }))
    await saveDraft(makeDraft({}, { id: 'draft-saved', state: 'saved' }))

    const wrapper = await mountHome(makeUser({ id: 'res-1', roles: ['resident'] }))

    expect(linksIn(wrapper, 'home-drafts')).toEqual([{ href: '/record/draft-1', text: 'SM-0007' }])
    expect(wrapper.find('[data-testid="home-drafts"]').text()).toContain('step 3 of 5')
  })

  it('lists the exams returned to the resident with the comment, each linking to the exam', async () => {
    const exam = makeExam({ patientCode: 'SM-0099', status: 'returned', returnComment: 'Recheck the angle' })
    vi.mocked(supervision.fetchReturnedExams).mockResolvedValue([exam])

    const wrapper = await mountHome(makeUser({ id: 'res-1', roles: ['resident'] }))

    expect(supervision.fetchReturnedExams).toHaveBeenCalledWith('res-1')
    expect(linksIn(wrapper, 'home-returned')).toEqual([{ href: `/exams/${exam.id}`, text: 'SM-0099' }])
    expect(wrapper.find('[data-testid="home-returned"]').text()).toContain('Recheck the angle')
  })

  it('shows an attending how many exams wait, the first few with links, and the way to the whole queue', async () => {
    const items = ['SM-0001', 'SM-0002', 'SM-0003'].map((patientCode) => ({
      exam: makeExam({ patientCode, status: 'submitted' }),
      waitingSeconds: 5 * HOUR,
    }))
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue({
      items,
      total: 8,
      page: 1,
      pageSize: 3,
      totalCapped: false,
      nextCursor: null,
    })

    const wrapper = await mountHome(makeUser({ id: 'att-1', roles: ['attending'] }))

    expect(vi.mocked(supervision.fetchSignoffQueue).mock.lastCall![0]).toMatchObject({ pageSize: 3, order: 'oldest' })
    expect(linksIn(wrapper, 'home-waiting').map((l) => l.href)).toEqual(items.map((i) => `/signoff/${i.exam.id}`))
    expect(wrapper.find('[data-testid="home-waiting"] h2').text()).toContain('(8)')
    expect(wrapper.find('[data-testid="home-queue-link"]').attributes('href')).toBe('/signoff')
  })

  it('does not ask a resident’s home for the sign-off queue', async () => {
    const wrapper = await mountHome(makeUser({ id: 'res-1', roles: ['resident'] }))

    expect(supervision.fetchSignoffQueue).not.toHaveBeenCalled()
    expect(wrapper.find('[data-testid="home-waiting"]').exists()).toBe(false)
  })

  it('when there is nothing to do, says so in each section', async () => {
    const wrapper = await mountHome(makeUser({ id: 'att-1', roles: ['attending'] }))

    const empty = wrapper.findAll('[data-testid="home-empty"]').map((p) => p.text())
    expect(empty).toEqual([
      'Nothing is waiting for your countersignature.',
      'No exam has been sent back to you.',
      'No unfinished exam on this device.',
    ])
  })

  it('shows when this device last synced, or that it has not', async () => {
    const first = await mountHome(makeUser({ id: 'res-1', roles: ['resident'] }))
    expect(first.find('[data-testid="home-sync"]').text()).toContain('Not synced yet on this device')
    first.unmount()
    setActivePinia(createPinia())
    await saveLastSync('res-1', '2026-12-01T09:30:00.000Z')

    const second = await mountHome(makeUser({ id: 'res-1', roles: ['resident'] }))

    expect(second.find('[data-testid="home-sync"]').text()).toContain('Last synced')
    expect(second.find('[data-testid="home-sync"]').text()).not.toContain('Not synced yet')
  })

  it('when the returned exams cannot be loaded, says so in that section and still shows the drafts', async () => {
    vi.mocked(supervision.fetchReturnedExams).mockRejectedValue(new TypeError('Failed to fetch'))
    await saveDraft(makeDraft({ patientCode: 'SM-0007' }, { id: 'draft-1' }))

    const wrapper = await mountHome(makeUser({ id: 'res-1', roles: ['resident'] }))

    expect(wrapper.find('[data-testid="home-returned"] [role="alert"]').exists()).toBe(true)
    expect(linksIn(wrapper, 'home-drafts')).toHaveLength(1)
  })

  it('has one h1, a heading per section and the caution', async () => {
    const wrapper = await mountHome(makeUser({ id: 'att-1', roles: ['attending'] }))

    expect(wrapper.findAll('h1')).toHaveLength(1)
    expect(wrapper.findAll('h2').map((h) => h.text())).toEqual([
      'Waiting for my signature',
      'Returned to me',
      'My drafts on this device',
      'Sync',
    ])
    expect(wrapper.find('[data-testid="caution-note"]').text()).toContain('wide error band')
  })
})

import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest'
import { mount } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { defineComponent, h } from 'vue'
import { RouterView, createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { db } from '@/db'
import { listDrafts, saveDraft } from '@/db/drafts'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import { makeDraft } from '../factories/draft'
import { makeUser } from '../factories/user'

vi.mock('@/api/exams', () => ({ createExam: vi.fn(), submitExam: vi.fn() }))

let pinia: Pinia

async function openAt(path: string) {
  useSessionStore().user = makeUser()
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push(path)
  // Rendered through a router-view, as the app does, so the view's leave guard has its route record.
  const Host = defineComponent({ render: () => h(RouterView) })
  const wrapper = mount(Host, { global: { plugins: [createVuetify(), router, pinia] } })
  await vi.waitFor(() =>
    expect(wrapper.find('[data-testid="step-header"], [data-testid="quick-exam"], [data-testid="draft-missing"]').exists()).toBe(true),
  )
  return { router, wrapper }
}

describe('BedsideView', () => {
  beforeAll(async () => {
    // The route loads the view lazily; compiling it here keeps that cost out of the first test's time limit.
    await import('@/views/BedsideView.vue')
  })

  beforeEach(async () => {
    pinia = createPinia()
    setActivePinia(pinia)
    await db.drafts.clear()
    localStorage.clear()
  })

  it('with no draft on this device, starts a new exam and puts its id in the address', async () => {
    const { router, wrapper } = await openAt('/record')

    await vi.waitFor(() => expect(router.currentRoute.value.params.draftId).toBeTruthy())
    const [created] = await listDrafts()
    expect(router.currentRoute.value.params.draftId).toBe(created!.id)
    expect(wrapper.find('[data-testid="step-title"]').text()).toBe('Patient and position')
  })

  it('opened to examine a patient someone else examined, starts a fresh draft for that patient and team', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0007' }, { id: 'unfinished' }))
    const teamId = makeUser().teams[0]!.id

    const { router } = await openAt(`/record?patientCode=SM-0142&teamId=${teamId}`)

    await vi.waitFor(() => expect(router.currentRoute.value.params.draftId).toBeTruthy())
    expect(router.currentRoute.value.params.draftId).not.toBe('unfinished')
    await vi.waitFor(async () => {
      const saved = await db.drafts.get(router.currentRoute.value.params.draftId as string)
      expect(saved?.fields).toMatchObject({ patientCode: 'SM-0142', teamId })
    })
  })

  it('resumes the latest unsaved draft and offers to start a new exam', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0007' }, { id: 'older', updatedAt: '2026-01-01T08:00:00.000Z' }))
    await saveDraft(makeDraft({ patientCode: 'SM-0142' }, { id: 'latest', updatedAt: '2026-01-01T09:00:00.000Z', step: 2 }))

    const { router, wrapper } = await openAt('/record')

    expect(router.currentRoute.value.params.draftId).toBe('latest')
    expect(wrapper.find('[data-testid="draft-resumed"]').text()).toContain('SM-0142')
    expect(wrapper.find('[data-testid="step-title"]').text()).toBe('Height')
  })

  it('starting a new exam keeps the resumed one on this device', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0142' }, { id: 'latest' }))
    const { router, wrapper } = await openAt('/record')

    await wrapper.find('[data-testid="start-new-exam"]').trigger('click')

    await vi.waitFor(() => expect(router.currentRoute.value.params.draftId).not.toBe('latest'))
    expect((await listDrafts()).map((row) => row.id)).toContain('latest')
  })

  it('opens the draft named in the address', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0007' }, { id: 'named', updatedAt: '2026-01-01T08:00:00.000Z' }))
    await saveDraft(makeDraft({ patientCode: 'SM-0142' }, { id: 'latest', updatedAt: '2026-01-01T09:00:00.000Z' }))

    const { wrapper } = await openAt('/record/named')

    expect(wrapper.find<HTMLInputElement>('[data-testid="patient-code"] input').element.value).toBe('SM-0007')
  })

  it('says so when the named draft is not on this device', async () => {
    const { wrapper } = await openAt('/record/elsewhere')

    expect(wrapper.find('[data-testid="draft-missing"]').text()).toContain('not on this device')
  })

  it('with ?mode=quick, shows the quick screen on the same draft, and keeps the mode in the address', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0142' }, { id: 'latest' }))

    const { router, wrapper } = await openAt('/record?mode=quick')

    expect(wrapper.find('[data-testid="quick-exam"]').exists()).toBe(true)
    expect(wrapper.find<HTMLInputElement>('[data-testid="patient-code"] input').element.value).toBe('SM-0142')
    await vi.waitFor(() => expect(router.currentRoute.value).toMatchObject({ params: { draftId: 'latest' }, query: { mode: 'quick' } }))
  })

  it('switching mode keeps every field, and the mode chosen opens next time the address names none', async () => {
    await saveDraft(makeDraft({ patientCode: 'SM-0142', inclinationDeg: 40 }, { id: 'latest' }))
    const { wrapper } = await openAt('/record/latest')
    expect(wrapper.find('[data-testid="step-header"]').exists()).toBe(true)

    await wrapper.find('[data-testid="record-mode-quick"]').trigger('click')

    await vi.waitFor(() => expect(wrapper.find('[data-testid="quick-exam"]').exists()).toBe(true))
    expect(wrapper.find<HTMLInputElement>('[data-testid="inclination-input"] input').element.value).toBe('40')
    wrapper.unmount()
    const again = await openAt('/record/latest')
    expect(again.wrapper.find('[data-testid="quick-exam"]').exists()).toBe(true)
  })
})

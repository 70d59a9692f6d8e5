import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import ExamLogView from '@/views/ExamLogView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import { useSyncStore } from '@/stores/sync'
import { db } from '@/db'
import { saveLastSync } from '@/db/meta'
import { formatDateTime } from '@/utils/format'
import * as api from '@/api/exams'
import * as supervision from '@/api/supervision'
import { makeExam, makeExamList } from '../components/exam/make-exam'
import { httpError } from '../factories/http-error'
import { makeUser } from '../factories/user'
import { clearDevice, examInput, save } from '../db/outbox-factory'

vi.mock('@/api/exams', () => ({ fetchExams: vi.fn(), fetchExam: vi.fn(), submitExam: vi.fn() }))
vi.mock('@/api/supervision')

const desktopWidth = window.innerWidth

async function mountLog(roles = makeUser().roles) {
  useSessionStore().user = makeUser({ roles })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'exams' })
  const wrapper = mount(ExamLogView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  // the desktop table is a lazy piece of the view; a load error shows instead of it
  const shown = () =>
    wrapper.find('[data-testid="exam-table"], [data-testid="exam-list"]').exists() || wrapper.findAll('button').some((b) => b.text() === 'Retry')
  await vi.waitFor(() => expect(shown()).toBe(true), { timeout: 10_000 })
  return { wrapper, router }
}

function lastQuery() {
  return vi.mocked(api.fetchExams).mock.lastCall?.[0]
}

describe('ExamLogView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(api.fetchExams).mockReset()
    vi.mocked(supervision.fetchReturnedExams).mockReset().mockResolvedValue([])
  })

  afterEach(() => {
    window.innerWidth = desktopWidth
    document.body.innerHTML = ''
  })

  it('shows each exam with its status, patient code, height, CVP and band', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam({ patientCode: 'SM-0142', status: 'submitted' })]))

    const { wrapper } = await mountLog()

    const row = wrapper.find('[data-testid="exam-table"] tbody tr')
    expect(row.text()).toContain('SM-0142')
    expect(row.text()).toContain('Submitted')
    expect(row.text()).toContain('4.0')
    expect(row.text()).toContain('13.7')
    expect(row.text()).toContain('9.2–18.2')
    expect(wrapper.find('[data-testid="export-csv"]').exists()).toBe(true)
  })

  it('says "estimated" in its column headers, shows the categories the band reaches and carries the caution', async () => {
    const arterial = makeExam({ patientCode: 'SM-0007', venousSigns: { 'not-palpable': 'absent', 'double-peaked': 'present' } })
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam({ patientCode: 'SM-0142' }), arterial]))

    const { wrapper } = await mountLog()

    const headers = wrapper.find('[data-testid="exam-table"] thead').text()
    expect(headers).toContain('Est. CVP (cmH₂O)')
    expect(headers).toContain('Est. category')
    // The worked example's band 9.2–18.2 reaches normal (5–10) and high (> 10), Cook 1990's categories.
    expect(wrapper.find('[data-testid="exam-table"] tbody tr').text()).toContain('normal or high')
    expect(wrapper.find(`[data-testid="arterial-${arterial.id}"]`).text()).toBe('Arterial evidence')
    expect(wrapper.find('[data-testid="exam-caution"]').text()).toContain('Estimate from physical examination')
  })

  it('when a patient code is typed, asks the server for that code from the first page', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    const { wrapper } = await mountLog()
    const input = wrapper.find('[data-testid="filter-patient"] input')

    await input.setValue('SM-0142')
    await input.trigger('change')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ patientCode: 'SM-0142', page: 1 })
  })

  it('when the log is filtered by one patient code, links to that patient over time', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    const { wrapper } = await mountLog()
    expect(wrapper.find('[data-testid="exam-log-timeline-link"]').exists()).toBe(false)
    const input = wrapper.find('[data-testid="filter-patient"] input')

    await input.setValue('SM-0142')
    await input.trigger('change')
    await flushPromises()

    expect(wrapper.find('[data-testid="exam-log-timeline-link"]').attributes('href')).toBe('/patients/SM-0142')
  })

  it('when a status chip is chosen, asks the server for that status only', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    const { wrapper } = await mountLog()

    await wrapper.find('[data-testid="filter-status-returned"]').trigger('click')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ status: 'returned' })
  })

  it('when a start date is chosen, sends the start of that local day', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    const { wrapper } = await mountLog()

    await wrapper.find('[data-testid="filter-from"] input').setValue('2026-03-01')
    await flushPromises()

    expect(lastQuery()?.from).toBe(new Date('2026-03-01T00:00:00').toISOString())
  })

  it('when the CVP header is clicked, asks the server to sort by CVP ascending, then descending', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    const { wrapper } = await mountLog()
    const header = () => wrapper.findAll('th').find((th) => th.text().includes('CVP'))!

    await header().trigger('click')
    await flushPromises()
    const first = lastQuery()
    await header().trigger('click')
    await flushPromises()

    expect(first).toMatchObject({ sort: 'cvpCmH2O', order: 'asc', page: 1 })
    expect(lastQuery()).toMatchObject({ sort: 'cvpCmH2O', order: 'desc' })
  })

  it('when more exams match than the server counts, says "10,000+" and still offers the next page', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue({ ...makeExamList([makeExam()], 10_000), totalCapped: true, nextCursor: 'after-page-1' })

    const { wrapper } = await mountLog()

    expect(wrapper.find('.v-data-table-footer').text()).toContain('of 10,000+')
    const next = wrapper.find('.v-data-table-footer button[aria-label="Next page"]')
    expect(next.attributes('disabled')).toBeUndefined()
  })

  it('when the next page button is pressed, asks the server for it with the cursor of this page', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue({ ...makeExamList([makeExam()], 60), nextCursor: 'after-page-1' })
    const { wrapper } = await mountLog()

    await wrapper.find('.v-data-table-footer button[aria-label="Next page"]').trigger('click')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ page: 2, cursor: 'after-page-1' })
  })

  it('when all matches are counted, shows the plain count', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()], 40))

    const { wrapper } = await mountLog()

    expect(wrapper.find('.v-data-table-footer').text()).toContain('of 40')
    expect(wrapper.find('.v-data-table-footer').text()).not.toContain('+')
  })

  it('when a row is clicked, opens that exam', async () => {
    const exam = makeExam()
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([exam]))
    const { wrapper, router } = await mountLog()

    await wrapper.find('[data-testid="exam-table"] tbody tr').trigger('click')

    // The detail view is a lazy route: its first compile can take more than the default second (and, on a busy
    // machine, more than the test's default five).
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('exam-detail'), { timeout: 20_000 })
    expect(router.currentRoute.value.params.id).toBe(exam.id)
  }, 30_000)

  it('when there are no exams, says so', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([]))

    const { wrapper } = await mountLog()

    expect(wrapper.find('[data-testid="exam-log-empty"]').text()).toContain('No exams yet')
  })

  it('when the server cannot be reached, says it shows the exams kept on this device', async () => {
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))

    const { wrapper } = await mountLog()

    await vi.waitFor(() => expect(wrapper.find('[data-testid="log-from-device"]').text()).toContain('kept on this device'))
    // The CSV is made by the server, so the download is not offered while the list comes from the device.
    expect(wrapper.find('[data-testid="export-csv"]').exists()).toBe(false)
  })

  it('offline, says the list comes from this device and when it last synced, and marks exams not yet sent', async () => {
    await clearDevice()
    const pulled = makeExam({ patientCode: 'SM-0311', status: 'submitted', examinedAt: '2026-03-01T08:00:00.000Z' })
    await db.exams.put({ ...pulled, ownerId: 'u-1' })
    const unsent = await save(examInput({ patientCode: 'SM-0312' }))
    await saveLastSync('u-1', '2026-03-13T18:00:00.000Z')
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))

    const { wrapper } = await mountLog()

    // the marks of unsent exams follow the rows (the outbox is read after them)
    await vi.waitFor(() => expect(wrapper.find('[data-testid="log-from-device"]').text()).toContain('One exam is saved here but not yet sent'))
    const banner = wrapper.find('[data-testid="log-from-device"]').text()
    expect(banner).toContain('this list comes from this device')
    expect(banner).toContain(`Last synced with the server ${formatDateTime('2026-03-13T18:00:00.000Z')}`)
    const rows = wrapper.findAll('[data-testid="exam-table"] tbody tr')
    expect(rows.map((row) => row.text().includes('SM-0312'))).toEqual([true, false])
    expect(wrapper.find(`[data-testid="unsent-${unsent.id}"]`).text()).toContain('Not yet sent')
    expect(wrapper.find(`[data-testid="unsent-${pulled.id}"]`).exists()).toBe(false)
    expect(wrapper.text()).not.toContain('Cannot reach the server')
  })

  it('offline with nothing kept on this device, says so without an error, and that it never synced', async () => {
    await clearDevice()
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))

    const { wrapper } = await mountLog()

    await vi.waitFor(() => expect(wrapper.find('[data-testid="exam-log-empty"]').text()).toContain('No exams are kept on this device yet'))
    expect(wrapper.find('[data-testid="log-synced-at"]').text()).toBe('This device has not synced with the server yet.')
    expect(wrapper.text()).not.toContain('Cannot reach the server')
  })

  it('once a sync succeeds, reads the log from the server again and drops the device banner', async () => {
    await clearDevice()
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))
    const { wrapper } = await mountLog()
    await vi.waitFor(() => expect(wrapper.find('[data-testid="log-from-device"]').exists()).toBe(true))
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam({ patientCode: 'SM-0400' })]))

    useSyncStore().lastSyncAt = '2026-03-14T10:00:00.000Z'

    await vi.waitFor(() => expect(wrapper.find('[data-testid="log-from-device"]').exists()).toBe(false))
    expect(wrapper.find('[data-testid="exam-table"] tbody tr').text()).toContain('SM-0400')
  })

  it('a read still waiting for its answer when a sync starts is read again once that sync ends', async () => {
    await clearDevice()
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam({ patientCode: 'SM-0401' })]))
    const { wrapper } = await mountLog()
    await flushPromises()
    let answer!: (list: ReturnType<typeof makeExamList>) => void
    vi.mocked(api.fetchExams).mockReturnValueOnce(new Promise((resolve) => (answer = resolve)))
    await wrapper.find('[data-testid="filter-status-draft"]').trigger('click')
    const sync = useSyncStore()

    sync.syncing = true
    await flushPromises()
    // answered before the sync's push reached the server
    answer(makeExamList([makeExam({ patientCode: 'SM-0401', status: 'draft' })]))
    await flushPromises()
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam({ patientCode: 'SM-0402', status: 'draft' })]))
    sync.syncing = false
    sync.lastSyncAt = '2026-03-14T10:00:00.000Z'

    await vi.waitFor(() => expect(wrapper.find('[data-testid="exam-table"] tbody').text()).toContain('SM-0402'))
    expect(lastQuery()).toMatchObject({ status: 'draft' })
  })

  it('a sync that overlapped no read, with nothing shown from the device, does not read the log again', async () => {
    await clearDevice()
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    await mountLog()
    await flushPromises()
    const reads = vi.mocked(api.fetchExams).mock.calls.length
    const sync = useSyncStore()

    sync.syncing = true
    await flushPromises()
    sync.syncing = false
    sync.lastSyncAt = '2026-03-14T10:00:00.000Z'
    await flushPromises()

    expect(vi.mocked(api.fetchExams).mock.calls.length).toBe(reads)
  })

  it('when the server fails, shows the load error with a retry', async () => {
    vi.mocked(api.fetchExams).mockRejectedValue(httpError(500, 'internal', 'Something went wrong on the server'))

    const { wrapper } = await mountLog()

    expect(wrapper.text()).toContain('Something went wrong on the server')
    expect(wrapper.findAll('button').some((button) => button.text().includes('Retry'))).toBe(true)
  })

  it('for an educator, who sees masked codes, offers neither a code search nor sorting by code', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))

    const { wrapper } = await mountLog(['educator'])

    expect(wrapper.find('[data-testid="filter-patient"]').exists()).toBe(false)
    const patientHeader = wrapper.findAll('th').find((th) => th.text() === 'Patient')
    expect(patientHeader?.classes()).not.toContain('v-data-table__th--sortable')
  })

  it('on a 390 px phone, lists compact rows with the estimate, its band and the status, under the caution', async () => {
    window.innerWidth = 390
    const exam = makeExam({ patientCode: 'SM-0142', status: 'countersigned' })
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([exam]))

    const { wrapper } = await mountLog()

    expect(wrapper.find('[data-testid="exam-table"]').exists()).toBe(false)
    const row = wrapper.get(`[data-testid="exam-row-${exam.id}"]`)
    expect(row.text()).toContain('SM-0142')
    expect(row.get('[data-testid="row-cvp"]').text()).toBe('13.7')
    expect(row.get('[data-testid="row-band"]').text()).toContain('9.2–18.2')
    expect(row.get('[data-testid="status-countersigned"]').text()).toBe('Countersigned')
    expect(row.get('a').attributes('href')).toBe(`/exams/${exam.id}`)
    const caution = wrapper.get('[data-testid="exam-caution"]')
    expect(caution.text()).toContain('Estimate from physical examination')
    // before the list in the page, so rows arriving never move it
    expect(caution.element.compareDocumentPosition(row.element) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy()
  })

  it('on a phone, folds the filters and the CSV behind one Filters button, so the rows come first', async () => {
    window.innerWidth = 390
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    const { wrapper } = await mountLog()
    const toggle = wrapper.get('[data-testid="exam-filters-toggle"]')
    expect(toggle.attributes('aria-expanded')).toBe('false')
    expect(wrapper.find('[data-testid="exam-filters"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="export-csv"]').exists()).toBe(false)

    await toggle.trigger('click')

    await vi.waitFor(() => expect(wrapper.find('[data-testid="filter-status-draft"]').exists()).toBe(true))
    expect(wrapper.find('[data-testid="export-csv"]').exists()).toBe(true)
    expect(toggle.attributes('aria-expanded')).toBe('true')
  })

  it('on a phone, the Filters button counts the filters in use, and a status chosen behind it asks the server', async () => {
    window.innerWidth = 390
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))
    const { wrapper } = await mountLog()
    expect(wrapper.find('[data-testid="exam-filters-count"]').exists()).toBe(false)
    await wrapper.get('[data-testid="exam-filters-toggle"]').trigger('click')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="filter-status-draft"]').exists()).toBe(true))

    await wrapper.get('[data-testid="filter-status-draft"]').trigger('click')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ status: 'draft', page: 1 })
    expect(wrapper.get('[data-testid="exam-filters-count"]').text()).toBe('(1)')
  })

  it('from the sm breakpoint, shows the filters and the CSV without a Filters button', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))

    const { wrapper } = await mountLog()

    await vi.waitFor(() => expect(wrapper.find('[data-testid="exam-filters"]').exists()).toBe(true))
    expect(wrapper.find('[data-testid="export-csv"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="exam-filters-toggle"]').exists()).toBe(false)
  })

  it('on a phone, the next page is asked for with the cursor of this page', async () => {
    window.innerWidth = 390
    vi.mocked(api.fetchExams).mockResolvedValue({ ...makeExamList([makeExam()], 60), nextCursor: 'after-page-1' })
    const { wrapper } = await mountLog()

    await wrapper.get('[data-testid="exam-list"] button[aria-label="Next page"]').trigger('click')
    await flushPromises()

    expect(lastQuery()).toMatchObject({ page: 2, cursor: 'after-page-1' })
  })

  it('on a phone while offline, still shows the device banner and the rows kept on this device', async () => {
    window.innerWidth = 390
    await clearDevice()
    const pulled = makeExam({ patientCode: 'SM-0311', status: 'submitted' })
    await db.exams.put({ ...pulled, ownerId: 'u-1' })
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))

    const { wrapper } = await mountLog()

    await vi.waitFor(() => expect(wrapper.find('[data-testid="log-from-device"]').exists()).toBe(true))
    expect(wrapper.get(`[data-testid="exam-row-${pulled.id}"]`).text()).toContain('SM-0311')
  })

  it('lists the author\'s returned exams with the attending\'s comment above the log', async () => {
    const returned = makeExam({ patientCode: 'SM-0157', status: 'returned', returnComment: 'Which vein? Say so in the notes.' })
    vi.mocked(supervision.fetchReturnedExams).mockResolvedValue([returned])
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([returned]))

    const { wrapper } = await mountLog()
    await vi.waitFor(() => expect(wrapper.find('[data-testid="returned-exams"]').exists()).toBe(true))

    const banner = wrapper.find('[data-testid="returned-exams"]')
    expect(supervision.fetchReturnedExams).toHaveBeenCalledWith('u-1')
    expect(banner.text()).toContain('One exam came back to you')
    expect(banner.text()).toContain('SM-0157')
    expect(banner.text()).toContain('Which vein? Say so in the notes.')
    expect(banner.find(`[data-testid="returned-${returned.id}"]`).attributes('href')).toBe(`/exams/${returned.id}`)
  })

  it('shows no returned banner when nothing came back', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))

    const { wrapper } = await mountLog()

    expect(wrapper.find('[data-testid="returned-exams"]').exists()).toBe(false)
  })

  it('does not look for returned exams for an educator, who records none', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam()]))

    await mountLog(['educator'])

    expect(supervision.fetchReturnedExams).not.toHaveBeenCalled()
  })
})

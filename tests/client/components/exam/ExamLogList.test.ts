import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { mount, flushPromises } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { ExamListQuerySchema, type Exam } from '#shared/schemas/exam'
import ExamLogList from '@/components/exam/ExamLogList.vue'
import { routes } from '@/router/routes'
import { makeExam } from './make-exam'

type ListProps = InstanceType<typeof ExamLogList>['$props']

function mountList(props: Partial<ListProps> & { exams: Exam[] }) {
  const router = createRouter({ history: createMemoryHistory(), routes })
  return mount(ExamLogList, {
    props: { total: props.exams.length, loading: false, query: ExamListQuerySchema.parse({}), filtered: false, ...props },
    global: { plugins: [createVuetify(), router] },
  })
}

describe('ExamLogList (the log on a phone)', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('gives each exam one compact row with its patient code, estimate in cmH₂O, 95% band and status', () => {
    const exam = makeExam({ patientCode: 'SM-0142', status: 'submitted' })

    const wrapper = mountList({ exams: [exam] })

    const row = wrapper.get(`[data-testid="exam-row-${exam.id}"]`)
    expect(row.text()).toContain('SM-0142')
    expect(row.get('[data-testid="row-cvp"]').text()).toBe('13.7')
    expect(row.text()).toContain('cmH₂O')
    expect(row.get('[data-testid="row-band"]').text()).toBe('(95% band 9.2–18.2)')
    expect(row.get('[data-testid="status-submitted"]').text()).toBe('Submitted')
    // the worked example's band 9.2–18.2 reaches normal (5–10) and high (> 10), Cook 1990's categories
    expect(row.get(`[data-testid="categories-${exam.id}"]`).text()).toBe('Est. category: normal or high')
  })

  describe('a full page', () => {
    afterEach(() => vi.useRealTimers())

    it('draws the rows a phone screen holds at once and the rest of the page in the next task', async () => {
      vi.useFakeTimers()
      const exams = Array.from({ length: 25 }, (_, i) => makeExam({ patientCode: `SM-${String(i).padStart(4, '0')}` }))

      const wrapper = mountList({ exams, total: 40 })

      expect(wrapper.findAll('[data-testid^="exam-row-"]')).toHaveLength(10)
      expect(wrapper.get('[data-testid="exam-list-range"]').text()).toBe('1–25 of 40')
      await vi.runAllTimersAsync()
      await flushPromises()
      expect(wrapper.findAll('[data-testid^="exam-row-"]').map((row) => row.text().slice(0, 7))).toEqual(exams.map((e) => e.patientCode))
    })
  })

  it('links each row to its exam', () => {
    const exam = makeExam()

    const wrapper = mountList({ exams: [exam] })

    expect(wrapper.get(`[data-testid="exam-row-${exam.id}"] a`).attributes('href')).toBe(`/exams/${exam.id}`)
  })

  it('marks an exam not yet sent and one with arterial evidence', () => {
    const pending = makeExam()
    const arterial = makeExam({ venousSigns: { 'not-palpable': 'absent', 'double-peaked': 'present' } })

    const wrapper = mountList({ exams: [pending, arterial], unsent: { [pending.id]: 'pending' } })

    expect(wrapper.get(`[data-testid="unsent-${pending.id}"]`).text()).toBe('Not yet sent')
    expect(wrapper.get(`[data-testid="arterial-${arterial.id}"]`).text()).toBe('Arterial evidence')
    expect(wrapper.find(`[data-testid="unsent-${arterial.id}"]`).exists()).toBe(false)
  })

  it('before the first answer, holds the room of the rows with placeholders that screen readers skip', () => {
    const wrapper = mountList({ exams: [], loading: true })

    const placeholder = wrapper.get('[data-testid="exam-list-placeholder"]')
    expect(placeholder.attributes('aria-hidden')).toBe('true')
    expect(placeholder.findAll('li').length).toBeGreaterThan(0)
    expect(wrapper.find('[data-testid="exam-log-empty"]').exists()).toBe(false)
  })

  it('with no exams and nothing loading, says there are none', () => {
    const wrapper = mountList({ exams: [] })

    expect(wrapper.get('[data-testid="exam-log-empty"]').text()).toContain('No exams yet')
  })

  it('when the server has a page after a capped count, says "10,000+" and asks for the next page', async () => {
    const wrapper = mountList({ exams: [makeExam()], total: 10_000, totalCapped: true, more: true })

    expect(wrapper.get('[data-testid="exam-list-range"]').text()).toBe('1–1 of 10,000+')
    await wrapper.get('button[aria-label="Next page"]').trigger('click')

    expect(wrapper.emitted('paging')).toEqual([[{ page: 2 }]])
  })

  it('on the last page, offers only the page before', async () => {
    const query = ExamListQuerySchema.parse({ page: 2, pageSize: 10 })
    const exams = [makeExam(), makeExam()]

    const wrapper = mountList({ exams, total: 12, query })

    expect(wrapper.get('[data-testid="exam-list-range"]').text()).toBe('11–12 of 12')
    expect(wrapper.get('button[aria-label="Next page"]').attributes('disabled')).toBeDefined()
    await wrapper.get('button[aria-label="Previous page"]').trigger('click')
    expect(wrapper.emitted('paging')).toEqual([[{ page: 1 }]])
  })
})

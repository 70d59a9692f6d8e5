import { afterEach, describe, expect, it, vi } from 'vitest'
import { mount } from '@vue/test-utils'
import { createVuetify } from 'vuetify'
import ExamLogFilters from '@/components/exam/ExamLogFilters.vue'
import type { ExamFilters } from '@/stores/exams'

function mountFilters(filters: ExamFilters = {}) {
  return mount(ExamLogFilters, { props: { filters }, global: { plugins: [createVuetify()] } })
}

describe('ExamLogFilters', () => {
  afterEach(() => {
    vi.useRealTimers()
  })

  it('waits for a pause in typing before filtering by patient code', async () => {
    vi.useFakeTimers()
    const wrapper = mountFilters()
    const input = wrapper.find<HTMLInputElement>('[data-testid="filter-patient"] input')

    input.element.value = 'SM-01'
    await input.trigger('input')
    const beforePause = wrapper.emitted('change')
    vi.advanceTimersByTime(400)

    expect(beforePause).toBeUndefined()
    expect(wrapper.emitted('change')).toEqual([[{ patientCode: 'SM-01' }]])
  })

  it('shows the filters it was given, with dates as local days', () => {
    const filters = { status: 'returned' as const, patientCode: 'SM-0142', from: new Date('2026-03-01T00:00:00').toISOString() }

    const wrapper = mountFilters(filters)

    expect(wrapper.find<HTMLInputElement>('[data-testid="filter-patient"] input').element.value).toBe('SM-0142')
    expect(wrapper.find<HTMLInputElement>('[data-testid="filter-from"] input').element.value).toBe('2026-03-01')
    expect(wrapper.find('[data-testid="filter-status-returned"]').classes()).toContain('text-primary')
  })

  it('"Clear filters" sends an empty set of filters once', async () => {
    const wrapper = mountFilters({ status: 'draft', patientCode: 'SM-0142' })

    await wrapper.find('[data-testid="filter-clear"]').trigger('click')
    await wrapper.vm.$nextTick()

    expect(wrapper.emitted('change')).toEqual([[{}]])
    expect(wrapper.find('[data-testid="filter-clear"]').exists()).toBe(false)
  })
})

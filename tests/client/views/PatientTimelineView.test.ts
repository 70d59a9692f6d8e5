import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import { Scatter } from 'vue-chartjs'
import type { ChartData } from 'chart.js'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import PatientTimelineView from '@/views/PatientTimelineView.vue'
import { routes } from '@/router/routes'
import { db } from '@/db/index'
import { useSessionStore } from '@/stores/session'
import * as loop from '@/api/loop'
import { makeExam } from '../components/exam/make-exam'
import { makeReference } from '../factories/loop'
import { makeUser } from '../factories/user'

vi.mock('@/api/loop')

const CODE = 'SM-0142'
// h = 4 cm at 45° (the worked example): a point estimate, elevated (h > 3 cm, McGee 1998, Am Heart J 136:10–18).
const seen = makeExam({ patientCode: CODE, examinedAt: '2026-03-14T09:00:00.000Z' })
// Above the neck: a lower bound. Not filled lying flat: an upper bound, not elevated.
const aboveNeck = makeExam({ patientCode: CODE, examinedAt: '2026-03-15T09:00:00.000Z', columnTop: 'above-neck', heightCm: 2, inclinationDeg: 90 })
const notFilled = makeExam({ patientCode: CODE, examinedAt: '2026-03-16T09:00:00.000Z', columnTop: 'not-filled', heightCm: null, inclinationDeg: 0 })
const reference = makeReference({ examId: seen.id, measuredAt: '2026-03-14T09:20:00.000Z', value: 12, unit: 'mmHg' })

async function mountView() {
  useSessionStore().user = makeUser({ id: 'u-1' })
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'patient-timeline', params: { code: CODE } })
  const wrapper = mount(PatientTimelineView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

const datasetsOf = (wrapper: Awaited<ReturnType<typeof mountView>>) => (wrapper.findComponent(Scatter).props('data') as ChartData<'scatter'>).datasets

describe('PatientTimelineView', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    vi.resetAllMocks()
    await db.exams.clear()
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('shows the caution, a chart over time and a table of the exams and the reference, oldest first', async () => {
    vi.mocked(loop.fetchPatientTimeline).mockResolvedValue({ patientCode: CODE, exams: [seen, aboveNeck, notFilled], references: [reference], caution: CAUTION_TEXT })

    const wrapper = await mountView()

    expect(wrapper.find('[data-testid="timeline-caution"]').text()).toBe(CAUTION_TEXT)
    expect(wrapper.find('[data-testid="timeline-chart"] canvas').exists()).toBe(true)
    const rows = wrapper.findAll('[data-testid="timeline-table"] tbody tr')
    expect(rows.map((r) => r.attributes('data-testid'))).toEqual(['timeline-row-exam', 'timeline-row-reference', 'timeline-row-exam', 'timeline-row-exam'])
    expect(rows[0]!.find('[data-testid="timeline-cvp"]').text()).toBe('13.7')
    expect(rows[1]!.text()).toContain('Central line CVP: 12 mmHg (16.3 cmH₂O)')
    expect(rows[2]!.find('[data-testid="timeline-cvp"]').text()).toMatch(/^≥ /)
    expect(rows[3]!.find('[data-testid="timeline-cvp"]').text()).toMatch(/^≤ /)
  })

  it('draws a point, each bound as an arrow pointing to its open side, the elevated exam ringed and the reference as its own mark', async () => {
    vi.mocked(loop.fetchPatientTimeline).mockResolvedValue({ patientCode: CODE, exams: [seen, aboveNeck, notFilled], references: [reference], caution: CAUTION_TEXT })

    const wrapper = await mountView()

    const sets = Object.fromEntries(datasetsOf(wrapper).map((set) => [set.label, set]))
    expect(sets['Estimate with its 95% band']!.data).toEqual([{ x: Date.parse(seen.examinedAt), y: seen.estimate.cvpCmH2O }])
    expect(sets['Lower bound (at least)']).toMatchObject({ pointStyle: 'triangle', data: [{ x: Date.parse(aboveNeck.examinedAt), y: aboveNeck.estimate.cvpCmH2O }] })
    expect(sets['Upper bound (at most)']).toMatchObject({ pointStyle: 'triangle', pointRotation: 180 })
    const ringed = (sets['Elevated']!.data as { x: number }[]).map((p) => p.x)
    expect(ringed).toContain(Date.parse(seen.examinedAt))
    expect(ringed).not.toContain(Date.parse(notFilled.examinedAt))
    expect(sets['Measured (reference)']!.data).toEqual([{ x: Date.parse(reference.measuredAt), y: reference.valueCmH2O }])
    expect(wrapper.find('[data-testid="timeline-chart-caption"]').text()).toContain('3 exams')
  })

  it("a resident opens their own exams from the table, while a teammate's exam shows only here", async () => {
    const teammate = makeExam({ patientCode: CODE, examinerId: 'u-2', examinerName: 'Dr Ada Park', examinedAt: '2026-03-14T12:00:00.000Z' })
    vi.mocked(loop.fetchPatientTimeline).mockResolvedValue({ patientCode: CODE, exams: [seen, teammate], references: [], caution: CAUTION_TEXT })

    const wrapper = await mountView()

    const rows = wrapper.findAll('[data-testid="timeline-row-exam"]')
    expect(rows[0]!.find('a').attributes('href')).toBe(`/exams/${seen.id}`)
    expect(rows[1]!.find('a').exists()).toBe(false)
    expect(rows[1]!.text()).toContain('Dr Ada Park')
  })

  it("with no network, shows this device's copies and says references are not kept offline", async () => {
    await db.exams.put({ ...seen, ownerId: 'u-1' })
    vi.mocked(loop.fetchPatientTimeline).mockRejectedValue(new TypeError('Failed to fetch'))

    const wrapper = await mountView()

    expect(wrapper.find('[data-testid="timeline-from-device"]').text()).toContain('Measured references are not kept offline')
    expect(wrapper.findAll('[data-testid="timeline-row-exam"]')).toHaveLength(1)
    expect(wrapper.find('[data-testid="timeline-caution"]').text()).toBe(CAUTION_TEXT)
  })
})

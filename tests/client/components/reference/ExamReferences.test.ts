import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createVuetify } from 'vuetify'
import ExamReferences from '@/components/reference/ExamReferences.vue'
import * as api from '@/api/references'
import { makeReference } from '../../factories/loop'
import { httpError } from '../../factories/http-error'

vi.mock('@/api/references')

const NOW = new Date('2026-03-14T10:30:00')

async function mountReferences(canAdd = true) {
  const wrapper = mount(ExamReferences, { props: { examId: 'exam-1', canAdd }, global: { plugins: [createVuetify()] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

async function openForm(wrapper: Awaited<ReturnType<typeof mountReferences>>) {
  await wrapper.find('[data-testid="reference-add"]').trigger('click')
  await flushPromises()
}

async function chooseKind(wrapper: Awaited<ReturnType<typeof mountReferences>>, kind: string) {
  await wrapper.findAllComponents({ name: 'VSelect' }).find((s) => s.attributes('data-testid') === 'reference-kind')!.setValue(kind)
  await flushPromises()
}

describe('ExamReferences', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.resetAllMocks()
    vi.useFakeTimers({ toFake: ['Date'] })
    vi.setSystemTime(NOW)
  })

  afterEach(() => {
    vi.useRealTimers()
    document.body.innerHTML = ''
  })

  it('lists the references with the value in cmH₂O and whether each pairs with the exam', async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([makeReference({ id: 'r-1' }), makeReference({ id: 'r-2', paired: false, kind: 'echo-ra', value: 8 })])

    const wrapper = await mountReferences()

    expect(wrapper.find('[data-testid="reference-r-1"]').text()).toContain('Central line CVP: 12 mmHg (16.3 cmH₂O)')
    expect(wrapper.find('[data-testid="reference-r-1"] [data-testid="reference-paired"]').text()).toBe('Paired')
    expect(wrapper.find('[data-testid="reference-r-2"] [data-testid="reference-unpaired"]').exists()).toBe(true)
  })

  it('offers no form to someone who may neither edit nor countersign the exam', async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([])

    const wrapper = await mountReferences(false)

    expect(wrapper.find('[data-testid="reference-add"]').exists()).toBe(false)
  })

  it('adds a central-line value in mmHg, measured now unless changed', async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([])
    vi.mocked(api.addReference).mockResolvedValue(makeReference({ id: 'r-new' }))
    const wrapper = await mountReferences()
    await openForm(wrapper)

    await wrapper.find('[data-testid="reference-value"] input').setValue('12')
    await wrapper.find('[data-testid="reference-save"]').trigger('submit')
    await flushPromises()

    expect(api.addReference).toHaveBeenCalledWith('exam-1', { kind: 'central-line', value: 12, unit: 'mmHg', measuredAt: new Date('2026-03-14T10:30').toISOString() })
    expect(wrapper.find('[data-testid="reference-r-new"]').exists()).toBe(true)
  })

  it('offers an echo estimate only as 3, 8 or 15 mmHg', async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([])
    vi.mocked(api.addReference).mockResolvedValue(makeReference({ id: 'r-echo', kind: 'echo-ra', value: 15 }))
    const wrapper = await mountReferences()
    await openForm(wrapper)

    await chooseKind(wrapper, 'echo-ra')
    const choices = wrapper.findAll('[data-testid="reference-echo-value"] button').map((b) => b.text())
    await wrapper.find('[data-testid="reference-echo-15"]').trigger('click')
    await wrapper.find('[data-testid="reference-save"]').trigger('submit')
    await flushPromises()

    expect(choices).toEqual(['3 mmHg', '8 mmHg', '15 mmHg'])
    expect(wrapper.find('[data-testid="reference-unit"]').exists()).toBe(false)
    expect(vi.mocked(api.addReference).mock.lastCall![1]).toMatchObject({ kind: 'echo-ra', value: 15, unit: 'mmHg' })
  })

  it('without a value, says so at the field and sends nothing', async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([])
    const wrapper = await mountReferences()
    await openForm(wrapper)

    await wrapper.find('[data-testid="reference-save"]').trigger('submit')
    await flushPromises()

    expect(wrapper.find('[data-testid="reference-value"]').text()).toContain('Enter the measured pressure')
    expect(api.addReference).not.toHaveBeenCalled()
  })

  it("shows the server's field error at the field it names", async () => {
    vi.mocked(api.fetchReferences).mockResolvedValue([])
    vi.mocked(api.addReference).mockRejectedValue(httpError(400, 'invalid-input', 'Check the marked fields', { measuredAt: 'The time cannot be in the future' }))
    const wrapper = await mountReferences()
    await openForm(wrapper)

    await wrapper.find('[data-testid="reference-value"] input').setValue('9')
    await wrapper.find('[data-testid="reference-save"]').trigger('submit')
    await flushPromises()

    expect(wrapper.find('[data-testid="reference-time"]').text()).toContain('The time cannot be in the future')
  })
})

import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import ExamDetailView from '@/views/ExamDetailView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as api from '@/api/exams'
import * as supervision from '@/api/supervision'
import { ExamSchema, type Exam } from '#shared/schemas/exam'
import { makeExam } from '../components/exam/make-exam'
import { httpError } from '../factories/http-error'
import { makeSignature } from '../factories/signature'
import { makeUser } from '../factories/user'
import { formatDateTimeWithZone } from '@/utils/format'

vi.mock('@/api/exams', () => ({ fetchExams: vi.fn(), fetchExam: vi.fn(), submitExam: vi.fn(), updateExam: vi.fn() }))
vi.mock('@/api/supervision')
vi.mock('@/api/references', () => ({ fetchReferences: vi.fn(async () => []), addReference: vi.fn() }))

async function mountDetail(exam: Exam, viewerId = exam.examinerId, roles = makeUser().roles) {
  useSessionStore().user = makeUser({ id: viewerId, roles })
  vi.mocked(api.fetchExam).mockResolvedValue(exam)
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'exam-detail', params: { id: exam.id } })
  const wrapper = mount(ExamDetailView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

function stubClipboard(writeText: (text: string) => Promise<void>) {
  Object.defineProperty(navigator, 'clipboard', { value: { writeText: vi.fn(writeText) }, configurable: true })
  return navigator.clipboard.writeText
}

describe('ExamDetailView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(api.submitExam).mockReset()
    vi.mocked(api.updateExam).mockReset()
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('shows the findings in groups and the estimate with its band', async () => {
    const wrapper = await mountDetail(makeExam())

    const text = wrapper.text()
    for (const group of ['Patient and position', 'Pulsation', 'Height', 'Waveform and manoeuvres', 'Notes']) expect(text).toContain(group)
    expect(wrapper.find('[data-testid="exam-estimate-cmh2o"]').text()).toContain('13.7')
    expect(wrapper.find('[data-testid="exam-version"]').text()).toBe('Version 1')
  })

  it('"Copy as note" writes the plain-text note to the clipboard and confirms it', async () => {
    const writeText = stubClipboard(async () => {})
    const wrapper = await mountDetail(makeExam())

    await wrapper.find('[data-testid="exam-copy-note"]').trigger('click')
    await flushPromises()

    expect(writeText).toHaveBeenCalledOnce()
    expect(vi.mocked(writeText).mock.calls[0]?.[0]).toContain('Estimated CVP: 13.7 cmH₂O (10.1 mmHg)')
    expect(document.body.textContent).toContain('Note copied')
  })

  it('when the clipboard refuses, shows the note in a dialog to copy by hand', async () => {
    stubClipboard(async () => {
      throw new DOMException('Denied', 'NotAllowedError')
    })
    const wrapper = await mountDetail(makeExam())

    await wrapper.find('[data-testid="exam-copy-note"]').trigger('click')
    await flushPromises()

    const textarea = document.querySelector<HTMLTextAreaElement>('[data-testid="note-text"] textarea')
    expect(textarea?.value).toContain('13.7 cmH₂O')
  })

  it.each(['draft', 'returned'] as const)('offers "Submit for countersignature" to the author of a %s exam', async (status) => {
    const wrapper = await mountDetail(makeExam({ status }))

    expect(wrapper.find('[data-testid="exam-submit"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="exam-edit"]').attributes('href')).toBe(`/record/${wrapper.vm.$route.params.id}`)
  })

  it.each(['submitted', 'countersigned'] as const)('does not offer submitting or editing a %s exam', async (status) => {
    const wrapper = await mountDetail(makeExam({ status }))

    expect(wrapper.find('[data-testid="exam-submit"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="exam-edit"]').exists()).toBe(false)
  })

  it("does not offer submitting another examiner's draft", async () => {
    const wrapper = await mountDetail(makeExam({ examinerId: 'u-1' }), 'u-2')

    expect(wrapper.find('[data-testid="exam-submit"]').exists()).toBe(false)
  })

  it('submitting sends the exam, shows its new status and hides the button', async () => {
    const exam = makeExam()
    vi.mocked(api.submitExam).mockResolvedValue({ ...exam, status: 'submitted', version: 2 })
    const wrapper = await mountDetail(exam)

    await wrapper.find('[data-testid="exam-submit"]').trigger('click')
    await flushPromises()

    expect(api.submitExam).toHaveBeenCalledWith(exam.id)
    expect(wrapper.find('[data-testid="status-submitted"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="exam-submit"]').exists()).toBe(false)
  })

  it('shows the countersignature with its printed name, time zone and meaning', async () => {
    const exam = makeExam({ status: 'countersigned', signatures: [makeSignature()] })

    const wrapper = await mountDetail(exam)

    const signature = wrapper.find('[data-testid="exam-signatures"]').text()
    expect(signature).toContain('Dr Tomas Lindqvist')
    expect(signature).toContain('14 Jul 2026, 09:30 BST (Europe/London)')
    expect(signature).toContain('Reviewed, and agrees with the findings')
  })

  it('"Copy as note" includes the countersignature', async () => {
    const writeText = stubClipboard(async () => {})
    const wrapper = await mountDetail(makeExam({ status: 'countersigned', signatures: [makeSignature()] }))

    await wrapper.find('[data-testid="exam-copy-note"]').trigger('click')
    await flushPromises()

    expect(vi.mocked(writeText).mock.calls[0]?.[0]).toContain('Countersigned by Dr Tomas Lindqvist, 14 Jul 2026, 09:30 BST')
  })

  it('shows the attending\'s comment at the top of a returned exam and offers one clear action, "Edit and resubmit", without "Amend"', async () => {
    const exam = makeExam({ status: 'returned', returnComment: 'Recheck the height with a ruler.' })

    const wrapper = await mountDetail(exam)

    expect(wrapper.find('[data-testid="exam-return-comment"]').text()).toContain('Recheck the height with a ruler.')
    expect(wrapper.find('[data-testid="exam-edit"]').text()).toBe('Edit and resubmit')
    expect(wrapper.find('[data-testid="exam-edit"]').attributes('href')).toBe(`/record/${exam.id}`)
    expect(wrapper.text()).not.toContain('Edit findings')
    expect(wrapper.find('[data-testid="exam-amend"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="exam-submit"]').text()).toBe('Resubmit unchanged')
  })

  it('offers "Amend" on the author\'s countersigned exam, which can no longer be edited directly', async () => {
    const wrapper = await mountDetail(makeExam({ status: 'countersigned', signatures: [makeSignature()] }))

    expect(wrapper.find('[data-testid="exam-amend"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="exam-edit"]').exists()).toBe(false)
  })

  it('amending a countersigned exam warns that the signature will be superseded, then reopens it as a draft', async () => {
    const exam = makeExam({ status: 'countersigned', signatures: [makeSignature()] })
    const superseded = makeSignature({ superseded: true, supersededAt: '2026-07-15T08:00:00.000+01:00' })
    vi.mocked(supervision.amendExam).mockResolvedValue({ ...exam, status: 'draft', version: 3, signatures: [superseded] })
    const wrapper = await mountDetail(exam)

    await wrapper.find('[data-testid="exam-amend"]').trigger('click')
    await flushPromises()
    const warning = document.querySelector('[data-testid="amend-dialog"]')?.textContent
    document.querySelector<HTMLElement>('[data-testid="amend-confirm"]')!.click()
    await flushPromises()

    expect(warning).toContain('marked as superseded')
    expect(supervision.amendExam).toHaveBeenCalledWith(exam.id, { baseVersion: exam.version })
    expect(wrapper.find('[data-testid="status-draft"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="signature-superseded"]').exists()).toBe(true)
  })

  it('offers an attending of the team to review and sign a submitted exam', async () => {
    const exam = makeExam({ status: 'submitted', examinerId: 'res-1', teamId: 't-1' })

    const wrapper = await mountDetail(exam, 'att-1', ['attending'])

    expect(wrapper.find('[data-testid="exam-review"]').exists()).toBe(true)
  })

  it('does not offer reviewing one\'s own exam, even to an attending', async () => {
    const exam = makeExam({ status: 'submitted', examinerId: 'att-1', teamId: 't-1' })

    const wrapper = await mountDetail(exam, 'att-1', ['attending'])

    expect(wrapper.find('[data-testid="exam-review"]').exists()).toBe(false)
  })

  it('opening the history panel shows who did what and when, with before → after', async () => {
    const exam = makeExam({ status: 'submitted' })
    vi.mocked(supervision.fetchExamHistory).mockResolvedValue([
      { id: 1, at: '2026-03-14T09:35:00.000Z', actorId: 'u-1', actorName: 'Dr Sam Whitcombe', action: 'exam-create', entityType: 'exam', entityId: exam.id, changes: null },
      { id: 2, at: '2026-03-14T09:40:00.000Z', actorId: 'u-1', actorName: 'Dr Sam Whitcombe', action: 'exam-update', entityType: 'exam', entityId: exam.id, changes: { heightCm: { from: 3, to: 4 } } },
    ])
    const wrapper = await mountDetail(exam)

    await wrapper.find('[data-testid="exam-history-toggle"]').trigger('click')
    await flushPromises()

    const events = wrapper.findAll('[data-testid="exam-history-event"]')
    expect(supervision.fetchExamHistory).toHaveBeenCalledWith(exam.id)
    expect(events).toHaveLength(2)
    expect(events[1]!.text()).toContain('Exam changed')
    expect(events[1]!.text()).toContain('Dr Sam Whitcombe')
    expect(events[1]!.text()).toContain('Above the sternal angle: 3.0 cm → 4.0 cm')
  })

  it('the copied note leaves the prompts out unless the clinician ticks "add prompts to the note"', async () => {
    const writeText = stubClipboard(async () => {})
    const wrapper = await mountDetail(makeExam({ waveform: { aWave: 'cannon', vWave: 'normal', yDescent: 'normal' } }))

    await wrapper.find('[data-testid="exam-copy-note"]').trigger('click')
    await flushPromises()
    await wrapper.find('[data-testid="exam-note-prompts"] input').setValue(true)
    await wrapper.find('[data-testid="exam-copy-note"]').trigger('click')
    await flushPromises()

    const [without, withPrompts] = vi.mocked(writeText).mock.calls.map(([note]) => note)
    expect(wrapper.find('[data-testid="exam-prompts"]').text()).toContain('Cannon a waves')
    expect(without).not.toContain('Cannon a waves')
    expect(withPrompts).toContain('Cannon a waves')
    expect(withPrompts).toContain('Prompts from Plumbline')
  })

  it('offers no prompt box when the estimate has no prompts', async () => {
    const wrapper = await mountDetail(makeExam())

    expect(wrapper.find('[data-testid="exam-note-prompts"]').exists()).toBe(false)
  })

  // Cook & Simel 1996 (JAMA 275:630–634): a palpable pulsation behaves like the carotid.
  it('with a palpable pulsation recorded, submitting stops until the author confirms the column is venous', async () => {
    const exam = makeExam({ venousSigns: { 'not-palpable': 'absent', 'double-peaked': 'present', 'falls-on-inspiration': 'present' } })
    const confirmed = { ...exam, venousConfirmed: true, version: 2 }
    vi.mocked(api.updateExam).mockResolvedValue(confirmed)
    vi.mocked(api.submitExam).mockResolvedValue({ ...confirmed, status: 'submitted', version: 3 })
    const wrapper = await mountDetail(exam)

    await wrapper.find('[data-testid="exam-submit"]').trigger('click')
    await flushPromises()
    const stopped = wrapper.find('[data-testid="venous-confirm"]').text()
    await wrapper.find('[data-testid="venous-confirm-checkbox"] input').setValue(true)
    await wrapper.find('[data-testid="exam-submit"]').trigger('click')
    await flushPromises()

    expect(stopped).toContain('Confirm that the column is venous before submitting')
    const { bandCmH2O, observerSource, settingsVersion } = exam.estimate
    expect(api.updateExam).toHaveBeenCalledWith(exam.id, { baseVersion: 1, venousConfirmed: true, reviewed: { bandCmH2O, observerSource, ...(settingsVersion ? { settingsVersion } : {}) } })
    expect(api.submitExam).toHaveBeenCalledOnce()
    expect(wrapper.find('[data-testid="status-submitted"]').exists()).toBe(true)
  })

  it('when the server refuses the submission on venousConfirmed, shows its message on the confirmation field', async () => {
    const message = 'The pulsation was palpable or persisted under light pressure: confirm that the column you measured is venous before submitting'
    vi.mocked(api.submitExam).mockRejectedValue(httpError(400, 'venous-not-confirmed', message, { venousConfirmed: message }))
    const wrapper = await mountDetail(makeExam())

    await wrapper.find('[data-testid="exam-submit"]').trigger('click')
    await flushPromises()

    expect(wrapper.find('[data-testid="venous-confirm"]').text()).toContain(message)
    expect(wrapper.find('[data-testid="exam-action-error"]').exists()).toBe(false)
  })

  it('when the error term changed between review and save, says so plainly with both bands and their sources', async () => {
    const exam = makeExam()
    const saved = { ...exam.estimate, bandCmH2O: [10.7, 16.7] as [number, number], observerSource: 'local-pairs' as const, settingsVersion: 2 }
    const reviewed = { bandCmH2O: [9.2, 18.2] as [number, number], observerSource: 'default' as const, settingsVersion: 2 }

    const wrapper = await mountDetail({ ...exam, estimate: { ...saved, reviewed } })

    const note = wrapper.find('[data-testid="exam-reviewed-changed"]').text()
    expect(note).toContain('The error term changed between review and save')
    expect(wrapper.find('[data-testid="exam-reviewed-band"]').text()).toBe('9.2–18.2 cmH₂O')
    expect(wrapper.find('[data-testid="exam-saved-band"]').text()).toBe('10.7–16.7 cmH₂O')
    expect(note).toContain('the default error term')
    expect(note).toContain('the local error term from paired exams')
  })

  it('says nothing of a changed band when the server stored the band that was reviewed', async () => {
    const wrapper = await mountDetail(makeExam())

    expect(wrapper.find('[data-testid="exam-reviewed-changed"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="exam-earlier-rules"]').exists()).toBe(false)
  })

  it('shows an estimate saved under the earlier rules as saved, with its settings version, never recomputed', async () => {
    const exam = makeExam()
    const firstRules = {
      ...{ cvpCmH2O: 13.7, cvpMmHg: 10.08, bandCmH2O: [10.7, 16.7], bandMmHg: [7.87, 12.28], offsetCm: 9.7, offsetModel: 'incline-adjusted' },
      ...{ heightCm: 4, sigmaCm: 1.53, bound: 'point', elevated: true, category: 'high', confidence: 'indeterminate', observerSource: 'local' },
      ...{ outsideStudiedRange: false, venousSignCount: 3, mayBeArterial: false, hints: [], caution: 'Estimate.', settingsVersion: 2 },
    }

    const wrapper = await mountDetail(ExamSchema.parse({ ...exam, estimate: firstRules }))

    expect(wrapper.find('[data-testid="exam-earlier-rules"]').text()).toContain('Saved under the earlier rules (settings version 2)')
    expect(wrapper.find('[data-testid="exam-estimate-band"]').text()).toContain('10.7–16.7 cmH₂O')
    expect(wrapper.find('[data-testid="exam-category"]').text()).toContain('high')
    expect(wrapper.find('[data-testid="exam-compare-toggle"]').exists()).toBe(false)
  })

  it("links to the patient's timeline and lets the author add a reference, also after countersigning", async () => {
    const exam = makeExam({ status: 'countersigned', patientCode: 'SM-0142' })

    const wrapper = await mountDetail(exam)

    expect(wrapper.find('[data-testid="exam-timeline-link"]').attributes('href')).toBe('/patients/SM-0142')
    expect(wrapper.find('[data-testid="exam-references"]').exists()).toBe(true)
    expect(wrapper.find('[data-testid="reference-add"]').exists()).toBe(true)
  })

  it("an attending of the exam's team may add a reference; a resident reading a teammate's exam may not", async () => {
    const exam = makeExam({ status: 'submitted', examinerId: 'res-1', teamId: 't-1' })

    const attending = await mountDetail(exam, 'att-1', ['attending'])
    const canAttending = attending.find('[data-testid="reference-add"]').exists()
    attending.unmount()
    const teammate = await mountDetail(exam, 'res-2', ['resident'])

    expect(canAttending).toBe(true)
    expect(teammate.find('[data-testid="exam-references"]').exists()).toBe(true)
    expect(teammate.find('[data-testid="reference-add"]').exists()).toBe(false)
  })

  it('an educator, who reads masked codes, gets neither the timeline link nor the references', async () => {
    const wrapper = await mountDetail(makeExam({ status: 'submitted', examinerId: 'res-1' }), 'edu-1', ['educator'])

    expect(wrapper.find('[data-testid="exam-timeline-link"]').exists()).toBe(false)
    expect(wrapper.find('[data-testid="exam-references"]').exists()).toBe(false)
  })

  describe('when printed', () => {
    const hiddenOnPaper = (element: Element | null) => !!element?.closest('.d-print-none')

    it('leaves out the actions, the export menu and the history, and keeps the result, the caution and the signatures', async () => {
      const wrapper = await mountDetail(makeExam({ status: 'countersigned', signatures: [makeSignature()] }))

      for (const id of ['exam-copy-note', 'exam-export', 'exam-history']) expect(hiddenOnPaper(wrapper.find(`[data-testid="${id}"]`).element)).toBe(true)
      for (const id of ['exam-result', 'exam-caution', 'exam-signatures', 'exam-findings'])
        expect(hiddenOnPaper(wrapper.find(`[data-testid="${id}"]`).element)).toBe(false)
    })

    it('says on paper alone when no countersignature stands, and when it was printed', async () => {
      const wrapper = await mountDetail(makeExam({ status: 'submitted' }))

      const note = wrapper.find('[data-testid="exam-print-note"]')
      expect(note.classes()).toEqual(expect.arrayContaining(['d-none', 'd-print-block']))
      expect(note.text()).toContain('Not countersigned (submitted).')
      expect(note.text()).toMatch(/Printed .+\./)
    })

    it('stamps the time of printing, not of opening the page', async () => {
      vi.useFakeTimers({ toFake: ['Date'] })
      vi.setSystemTime(new Date('2026-03-14T09:00:00Z'))
      const wrapper = await mountDetail(makeExam())

      vi.setSystemTime(new Date('2026-03-14T11:45:00Z'))
      window.dispatchEvent(new Event('beforeprint'))
      await flushPromises()
      vi.useRealTimers()

      expect(wrapper.find('[data-testid="exam-print-note"]').text()).toContain(`Printed ${formatDateTimeWithZone('2026-03-14T11:45:00Z')}.`)
    })

    it('does not say "Not countersigned" on a countersigned record', async () => {
      const wrapper = await mountDetail(makeExam({ status: 'countersigned', signatures: [makeSignature()] }))

      expect(wrapper.find('[data-testid="exam-print-note"]').text()).not.toContain('Not countersigned')
    })
  })
})

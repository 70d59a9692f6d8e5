import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { createMemoryHistory, createRouter } from 'vue-router'
import { createVuetify } from 'vuetify'
import type { Exam } from '#shared/schemas/exam'
import ExamReviewView from '@/views/ExamReviewView.vue'
import { routes } from '@/router/routes'
import { useSessionStore } from '@/stores/session'
import * as exams from '@/api/exams'
import * as supervision from '@/api/supervision'
import { makeExam } from '../components/exam/make-exam'
import { httpError } from '../factories/http-error'
import { makeSignature } from '../factories/signature'
import { makeUser } from '../factories/user'

vi.mock('@/api/exams', () => ({ fetchExam: vi.fn(), fetchExams: vi.fn(), submitExam: vi.fn(), updateExam: vi.fn(), createExam: vi.fn() }))
vi.mock('@/api/supervision')

async function mountReview(exam = makeExam({ status: 'submitted', examinerId: 'res-1' })) {
  useSessionStore().user = makeUser({ id: 'att-1', displayName: 'Dr Tomas Lindqvist', roles: ['attending'] })
  vi.mocked(exams.fetchExam).mockResolvedValue(exam)
  const router = createRouter({ history: createMemoryHistory(), routes })
  await router.push({ name: 'exam-review', params: { id: exam.id } })
  const wrapper = mount(ExamReviewView, { global: { plugins: [createVuetify(), router] }, attachTo: document.body })
  await flushPromises()
  return { wrapper, exam }
}

const $ = (testid: string) => document.querySelector<HTMLElement>(`[data-testid="${testid}"]`)
const isOpen = (testid: string) => $(testid)?.classList.contains('v-overlay--active') ?? false
const fieldMessage = (testid: string) => $(testid)?.querySelector('.v-messages')?.textContent?.trim() ?? ''

async function click(testid: string) {
  $(testid)!.click()
  await flushPromises()
}

async function type(testid: string, value: string, tag = 'input') {
  const field = $(testid)!.querySelector<HTMLInputElement>(tag)!
  field.value = value
  field.dispatchEvent(new Event('input'))
  await flushPromises()
}

async function check(testid: string) {
  $(testid)!.querySelector('input')!.click()
  await flushPromises()
}

async function chooseMeaning(meaning: string) {
  $(`meaning-${meaning}`)!.querySelector('input')!.click()
  await flushPromises()
}

function signed(exam: Exam): Exam {
  return { ...exam, status: 'countersigned', signatures: [makeSignature({ examId: exam.id, examVersion: exam.version })] }
}

describe('ExamReviewView', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(supervision.countersignExam).mockReset()
    vi.mocked(supervision.returnExam).mockReset()
    vi.mocked(supervision.fetchSignoffCount).mockResolvedValue(0)
  })

  afterEach(() => {
    document.body.innerHTML = ''
  })

  it('shows the whole exam: its estimate and every group of findings', async () => {
    const { wrapper } = await mountReview()

    expect(wrapper.find('[data-testid="exam-estimate-cmh2o"]').text()).toContain('13.7')
    expect(wrapper.find('[data-testid="exam-findings"]').text()).toContain('Waveform and manoeuvres')
  })

  it('offers recording an own exam of the same patient and team', async () => {
    const { wrapper, exam } = await mountReview()

    const link = wrapper.find('[data-testid="review-own-exam"]').attributes('href')

    expect(link).toBe(`/record?patientCode=${exam.patientCode}&teamId=${exam.teamId}`)
  })

  it("the countersign dialog shows the signer's printed name and says the signature is legally meaningful", async () => {
    await mountReview()

    await click('review-countersign')

    expect($('countersign-signer')?.textContent).toBe('Dr Tomas Lindqvist')
    expect($('countersign-legal')?.textContent).toContain('legally meaningful electronic signature')
  })

  it('countersigning without choosing a meaning shows a field error and sends nothing', async () => {
    await mountReview()
    await click('review-countersign')
    await type('countersign-password', 'bedside-demo')

    await click('countersign-submit')

    expect(fieldMessage('countersign-meaning')).toBe('Choose what your signature means')
    expect(supervision.countersignExam).not.toHaveBeenCalled()
  })

  it('a wrong password shows an error on the password field, keeps the dialog open and keeps the chosen meaning', async () => {
    vi.mocked(supervision.countersignExam).mockRejectedValue(httpError(401, 'signature-password', 'The password is not right'))
    await mountReview()
    await click('review-countersign')
    await chooseMeaning('reviewed-re-examined')
    await type('countersign-height', '6')
    await type('countersign-inclination', '45')
    await type('countersign-password', 'wrong')

    await click('countersign-submit')

    expect(fieldMessage('countersign-password')).toContain('That password is not right')
    expect(isOpen('countersign-dialog')).toBe(true)
    expect($('meaning-reviewed-re-examined')!.querySelector('input')!.checked).toBe(true)
    expect($('countersign-height')!.querySelector('input')!.value).toBe('6')
    expect(useSessionStore().user).not.toBeNull()
  })

  it('signing sends the password, the meaning and the version, closes the dialog and shows the signature', async () => {
    const { wrapper, exam } = await mountReview()
    vi.mocked(supervision.countersignExam).mockResolvedValue(signed(exam))
    await click('review-countersign')
    await chooseMeaning('reviewed-agree')
    await type('countersign-password', 'bedside-demo')

    await click('countersign-submit')

    expect(supervision.countersignExam).toHaveBeenCalledWith(exam.id, { password: 'bedside-demo', meaning: 'reviewed-agree', baseVersion: exam.version })
    expect(isOpen('countersign-dialog')).toBe(false)
    expect(wrapper.find('[data-testid="signature-name"]').text()).toBe('Dr Tomas Lindqvist')
    expect(wrapper.find('[data-testid="review-actions"]').exists()).toBe(false)
  })

  it('after too many wrong passwords, shows the wait in the dialog rather than on the field', async () => {
    vi.mocked(supervision.countersignExam).mockRejectedValue(httpError(429, 'too-many-attempts', 'Too many wrong passwords; wait 15 minutes'))
    await mountReview()
    await click('review-countersign')
    await chooseMeaning('reviewed-agree')
    await type('countersign-password', 'wrong again')

    await click('countersign-submit')

    expect($('countersign-error')?.textContent).toContain('wait 15 minutes')
    expect(isOpen('countersign-dialog')).toBe(true)
  })

  it('returning without a comment shows a field error and sends nothing', async () => {
    await mountReview()
    await click('review-return')

    await click('return-submit')

    expect(fieldMessage('return-comment')).toContain('should change')
    expect(supervision.returnExam).not.toHaveBeenCalled()
  })

  it('returning with a comment sends it and the exam leaves the review', async () => {
    const { wrapper, exam } = await mountReview()
    vi.mocked(supervision.returnExam).mockResolvedValue({ ...exam, status: 'returned', returnComment: 'Measure again at 45°.' })
    await click('review-return')
    await type('return-comment', 'Measure again at 45°.', 'textarea')

    await click('return-submit')

    expect(supervision.returnExam).toHaveBeenCalledWith(exam.id, { comment: 'Measure again at 45°.', baseVersion: exam.version })
    expect(wrapper.find('[data-testid="review-done"]').exists()).toBe(true)
  })
  it('with "re-examined", asks for the height and inclination and sends nothing until they are given', async () => {
    await mountReview()
    await click('review-countersign')
    expect($('countersign-reading')).toBeNull()

    await chooseMeaning('reviewed-re-examined')
    await type('countersign-password', 'bedside-demo')
    await click('countersign-submit')

    expect($('countersign-reading')).not.toBeNull()
    expect(fieldMessage('countersign-height')).toBe('Enter the height you read')
    expect(fieldMessage('countersign-inclination')).toBe('Enter the inclination')
    expect(supervision.countersignExam).not.toHaveBeenCalled()
  })

  it('signs with the attending\'s reading, the time they examined and the feedback chosen', async () => {
    const { exam } = await mountReview()
    vi.mocked(supervision.countersignExam).mockResolvedValue(signed(exam))
    await click('review-countersign')
    await chooseMeaning('reviewed-re-examined')
    await type('countersign-height', '6,5')
    await type('countersign-inclination', '45')
    await type('countersign-examined-at', '2026-03-14T10:15')
    await check('countersign-feedback-read-peak-not-mean')
    await check('countersign-feedback-other')
    await type('countersign-feedback-text', 'Use the bed lever, not pillows.', 'textarea')
    await type('countersign-password', 'bedside-demo')

    await click('countersign-submit')

    expect(supervision.countersignExam).toHaveBeenCalledWith(exam.id, {
      password: 'bedside-demo',
      meaning: 'reviewed-re-examined',
      baseVersion: exam.version,
      attendingReading: { heightCm: 6.5, inclinationDeg: 45, examinedAt: new Date('2026-03-14T10:15').toISOString() },
      feedback: ['read-peak-not-mean', 'other'],
      feedbackText: 'Use the bed lever, not pillows.',
    })
    expect(isOpen('countersign-dialog')).toBe(false)
  })

  it('"other" feedback without words shows the message at the text field', async () => {
    await mountReview()
    await click('review-countersign')
    await chooseMeaning('reviewed-agree')
    await check('countersign-feedback-other')
    await type('countersign-password', 'bedside-demo')

    await click('countersign-submit')

    expect(fieldMessage('countersign-feedback-text')).toBe('Say what the other point of feedback is')
    expect(supervision.countersignExam).not.toHaveBeenCalled()
  })

  it("shows the server's field errors for the reading at the field they belong to", async () => {
    vi.mocked(supervision.countersignExam).mockRejectedValue(
      httpError(400, 'invalid-input', 'Check the marked fields', { 'attendingReading.examinedAt': 'The time you examined cannot be in the future' }),
    )
    await mountReview()
    await click('review-countersign')
    await chooseMeaning('reviewed-re-examined')
    await type('countersign-height', '6')
    await type('countersign-inclination', '45')
    await type('countersign-examined-at', '2099-01-01T10:00')
    await type('countersign-password', 'bedside-demo')

    await click('countersign-submit')

    expect(fieldMessage('countersign-examined-at')).toBe('The time you examined cannot be in the future')
    expect(isOpen('countersign-dialog')).toBe(true)
  })
})

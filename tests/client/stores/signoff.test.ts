import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { useExamsStore } from '@/stores/exams'
import { useSignoffStore } from '@/stores/signoff'
import * as supervision from '@/api/supervision'
import { makeExam } from '../components/exam/make-exam'
import { makeSignature } from '../factories/signature'

vi.mock('@/api/supervision')
vi.mock('@/api/exams', () => ({ fetchExam: vi.fn(), fetchExams: vi.fn(), submitExam: vi.fn(), updateExam: vi.fn(), createExam: vi.fn() }))

describe('sign-off store', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.resetAllMocks()
  })

  it('keeps the last known count when the count cannot be fetched, and does not throw', async () => {
    vi.mocked(supervision.fetchSignoffCount).mockResolvedValueOnce(3).mockRejectedValueOnce(new TypeError('Failed to fetch'))
    const store = useSignoffStore()
    await store.refreshCount()

    await store.refreshCount()

    expect(store.count).toBe(3)
  })

  it('loading the queue also updates the count', async () => {
    const item = { exam: makeExam({ status: 'submitted' }), waitingSeconds: 60 }
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue({
      items: [item],
      total: 7,
      page: 1,
      pageSize: 25,
      totalCapped: false,
      nextCursor: null,
    })
    const store = useSignoffStore()

    await store.loadQueue()

    expect(store.count).toBe(7)
  })

  it('a countersigned exam leaves the queue and replaces the exam on screen', async () => {
    const exam = makeExam({ status: 'submitted' })
    const signed = { ...exam, status: 'countersigned' as const, signatures: [makeSignature({ examId: exam.id })] }
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue({
      items: [{ exam, waitingSeconds: 60 }],
      total: 1,
      page: 1,
      pageSize: 25,
      totalCapped: false,
      nextCursor: null,
    })
    vi.mocked(supervision.countersignExam).mockResolvedValue(signed)
    vi.mocked(supervision.fetchSignoffCount).mockResolvedValue(0)
    const store = useSignoffStore()
    await store.loadQueue()
    useExamsStore().current = exam

    await store.countersign(exam.id, { password: 'bedside-demo', meaning: 'reviewed-agree', baseVersion: 1 })

    expect(store.items).toEqual([])
    expect(store.total).toBe(0)
    expect(useExamsStore().current).toEqual(signed)
  })

  it('a failed countersignature changes nothing', async () => {
    const exam = makeExam({ status: 'submitted' })
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue({
      items: [{ exam, waitingSeconds: 60 }],
      total: 1,
      page: 1,
      pageSize: 25,
      totalCapped: false,
      nextCursor: null,
    })
    vi.mocked(supervision.countersignExam).mockRejectedValue(new Error('401'))
    const store = useSignoffStore()
    await store.loadQueue()
    useExamsStore().current = exam

    await expect(store.countersign(exam.id, { password: 'x', meaning: 'reviewed-agree' })).rejects.toThrow()

    expect(store.items).toHaveLength(1)
    expect(useExamsStore().current).toEqual(exam)
  })

  it('a resubmitted or amended exam drops out of the returned list', async () => {
    const returned = makeExam({ status: 'returned', returnComment: 'Recheck.' })
    vi.mocked(supervision.fetchReturnedExams).mockResolvedValue([returned])
    vi.mocked(supervision.amendExam).mockResolvedValue({ ...returned, status: 'draft', version: 2 })
    const store = useSignoffStore()
    await store.loadReturned(returned.examinerId)

    await store.amend(returned.id, 1)

    expect(store.returned).toEqual([])
  })

  it('loads the queue in the order, search and resident chosen, and leaves the badge alone when filtered', async () => {
    vi.mocked(supervision.fetchSignoffCount).mockResolvedValue(9)
    vi.mocked(supervision.fetchSignoffQueue).mockResolvedValue({
      items: [],
      total: 2,
      page: 1,
      pageSize: 25,
      totalCapped: false,
      nextCursor: null,
    })
    const store = useSignoffStore()
    await store.refreshCount()
    Object.assign(store, { order: 'newest', search: ' SM-01 ', residentId: 'res-1' })

    await store.loadQueue()

    expect(vi.mocked(supervision.fetchSignoffQueue).mock.lastCall![0]).toMatchObject({ order: 'newest', q: 'SM-01', residentId: 'res-1' })
    expect(store.total).toBe(2)
    expect(store.count).toBe(9)
  })

  it('a settled exam lowers its resident’s count, and a resident with none left drops out', async () => {
    const exam = makeExam({ status: 'submitted', examinerId: 'res-1' })
    vi.mocked(supervision.fetchSignoffResidents).mockResolvedValue([
      { residentId: 'res-1', name: 'Dr Ayo Okafor', count: 1 },
      { residentId: 'res-2', name: 'Dr Sam Whitcombe', count: 2 },
    ])
    vi.mocked(supervision.returnExam).mockResolvedValue({ ...exam, status: 'returned' })
    const store = useSignoffStore()
    store.items = [{ exam, waitingSeconds: 60 }]
    await store.loadResidents()

    await store.returnWithComment(exam.id, { comment: 'Redo at 45°' })

    expect(store.residents).toEqual([{ residentId: 'res-2', name: 'Dr Sam Whitcombe', count: 2 }])
  })
})

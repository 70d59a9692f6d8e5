import { beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { useExamsStore } from '@/stores/exams'
import * as api from '@/api/exams'
import { db } from '@/db'
import { saveLastSync } from '@/db/meta'
import { settleResults } from '@/db/outbox-settle'
import { useSessionStore } from '@/stores/session'
import { makeExam, makeExamList } from '../components/exam/make-exam'
import { httpError } from '../factories/http-error'
import { makeUser } from '../factories/user'
import { clearDevice, examInput, queued, save } from '../db/outbox-factory'

vi.mock('@/api/exams', () => ({ fetchExams: vi.fn(), fetchExam: vi.fn(), submitExam: vi.fn() }))

const lastCall = () => vi.mocked(api.fetchExams).mock.lastCall?.[0]

describe('exams store', () => {
  beforeEach(() => {
    setActivePinia(createPinia())
    vi.mocked(api.fetchExams).mockReset()
    vi.mocked(api.fetchExam).mockReset()
    vi.mocked(api.submitExam).mockReset()
  })

  it('loads the newest exams first by default and keeps the total', async () => {
    const rows = [makeExam(), makeExam()]
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList(rows, 40))
    const store = useExamsStore()

    await store.loadList()

    expect(api.fetchExams).toHaveBeenCalledWith(expect.objectContaining({ sort: 'examinedAt', order: 'desc', page: 1, pageSize: 25 }))
    expect(store.exams).toEqual(rows)
    expect(store.total).toBe(40)
  })

  it('asks for the next page with the cursor the page before gave, and for the first page with none', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue({ ...makeExamList([makeExam()], 60), nextCursor: 'after-page-1' })
    const store = useExamsStore()
    await store.loadList()

    store.setPaging({ ...store.query, page: 2 })
    await store.loadList()

    expect(vi.mocked(api.fetchExams).mock.calls[0]![0]).toMatchObject({ page: 1, cursor: undefined })
    expect(vi.mocked(api.fetchExams).mock.calls[1]![0]).toMatchObject({ page: 2, cursor: 'after-page-1' })
  })

  it('going back to a page already seen, asks for it with the same cursor as before', async () => {
    vi.mocked(api.fetchExams)
      .mockResolvedValueOnce({ ...makeExamList([makeExam()], 90), nextCursor: 'after-page-1' })
      .mockResolvedValueOnce({ ...makeExamList([makeExam()], 90), page: 2, nextCursor: 'after-page-2' })
      .mockResolvedValue(makeExamList([makeExam()], 90))
    const store = useExamsStore()
    await store.loadList()
    store.setPaging({ ...store.query, page: 2 })
    await store.loadList()
    store.setPaging({ ...store.query, page: 3 })
    await store.loadList()

    store.setPaging({ ...store.query, page: 2 })
    await store.loadList()

    expect(vi.mocked(api.fetchExams).mock.calls.map(([q]) => q?.cursor)).toEqual([
      undefined,
      'after-page-1',
      'after-page-2',
      'after-page-1',
    ])
  })

  it.each([
    ['the filters change', (store: ReturnType<typeof useExamsStore>) => store.setFilters({ status: 'submitted' })],
    ['the sort changes', (store: ReturnType<typeof useExamsStore>) => store.setPaging({ ...store.query, sort: 'cvpCmH2O', page: 2 })],
    ['the page size changes', (store: ReturnType<typeof useExamsStore>) => store.setPaging({ ...store.query, pageSize: 50, page: 2 })],
  ])('when %s, forgets the cursors of the old order', async (_what, change) => {
    vi.mocked(api.fetchExams).mockResolvedValue({ ...makeExamList([makeExam()], 60), nextCursor: 'after-page-1' })
    const store = useExamsStore()
    await store.loadList()
    vi.mocked(api.fetchExams).mockClear()

    change(store)
    await store.loadList()

    expect(lastCall()?.cursor).toBeUndefined()
  })

  it('keeps that more exams match than the server counted', async () => {
    vi.mocked(api.fetchExams).mockResolvedValue({ ...makeExamList([makeExam()], 10_000), totalCapped: true, nextCursor: 'next' })
    const store = useExamsStore()

    await store.loadList()

    expect(store.total).toBe(10_000)
    expect(store.totalCapped).toBe(true)
  })

  it('with no network, shows the exams kept on this device for the signed-in user, filtered and sorted', async () => {
    await db.exams.clear()
    useSessionStore().user = makeUser({ id: 'u-1' })
    const older = makeExam({ examinedAt: '2026-11-01T08:00:00.000Z', status: 'submitted' })
    const newer = makeExam({ examinedAt: '2026-11-02T08:00:00.000Z', status: 'submitted' })
    const draft = makeExam({ examinedAt: '2026-11-03T08:00:00.000Z', status: 'draft' })
    const someoneElses = makeExam({ examinedAt: '2026-11-04T08:00:00.000Z', status: 'submitted' })
    await db.exams.bulkPut([
      ...[older, newer, draft].map((e) => ({ ...e, ownerId: 'u-1' })),
      { ...someoneElses, ownerId: 'u-2' },
    ])
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))
    const store = useExamsStore()
    store.setFilters({ status: 'submitted' })

    await store.loadList()

    expect(store.fromDevice).toBe(true)
    expect(store.exams.map((e) => e.id)).toEqual([newer.id, older.id])
    expect(store.total).toBe(2)
  })

  it('with no network, lists the exams saved here and not yet sent, marked so, with when the device last synced', async () => {
    await clearDevice()
    useSessionStore().user = makeUser({ id: 'u-1' })
    const pulled = makeExam({ examinedAt: '2026-03-10T08:00:00.000Z', status: 'countersigned' })
    await db.exams.put({ ...pulled, ownerId: 'u-1' })
    const unsent = await save(examInput({ examinedAt: '2026-03-14T09:30:00.000Z' }))
    await saveLastSync('u-1', '2026-03-13T18:00:00.000Z')
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))
    const store = useExamsStore()

    await store.loadList()

    expect(store.fromDevice).toBe(true)
    expect(store.exams.map((e) => [e.id, e.status])).toEqual([
      [unsent.id, 'draft'],
      [pulled.id, 'countersigned'],
    ])
    expect(store.unsent).toEqual({ [unsent.id]: 'pending' })
    expect(store.deviceSyncedAt).toBe('2026-03-13T18:00:00.000Z')
  })

  it('with no network, marks an exam whose change the server refused as needing attention, and filters device copies by status', async () => {
    await clearDevice()
    useSessionStore().user = makeUser({ id: 'u-1' })
    const refused = await save()
    const waiting = await save()
    await settleResults(await queued().then((items) => items.filter((i) => i.examId === refused.id)), [
      { id: refused.id, result: 'rejected', error: { code: 'invalid-input', message: 'Some fields need attention' } },
    ])
    await db.exams.put({ ...makeExam({ status: 'submitted' }), ownerId: 'u-1' })
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))
    const store = useExamsStore()
    store.setFilters({ status: 'draft' })

    await store.loadList()

    expect(store.exams.map((e) => e.id).sort()).toEqual([refused.id, waiting.id].sort())
    expect(store.total).toBe(2)
    expect(store.unsent).toEqual({ [refused.id]: 'attention', [waiting.id]: 'pending' })
    expect(store.deviceSyncedAt).toBeNull()
  })

  it('with no network, sorting device copies by height puts exams without a height last either way', async () => {
    await clearDevice()
    useSessionStore().user = makeUser({ id: 'u-1' })
    const low = makeExam({ heightCm: 2 })
    const high = makeExam({ heightCm: 6 })
    const unseen = makeExam({ columnTop: 'not-assessable', notAssessableReason: 'habitus', heightCm: null })
    await db.exams.bulkPut([unseen, high, low].map((e) => ({ ...e, ownerId: 'u-1' })))
    vi.mocked(api.fetchExams).mockRejectedValue(new TypeError('Failed to fetch'))
    const store = useExamsStore()
    const order = async (direction: 'asc' | 'desc') => {
      store.setPaging({ page: 1, pageSize: 25, sort: 'heightCm', order: direction })
      await store.loadList()
      return store.exams.map((e) => e.id)
    }

    expect(unseen.estimate.heightCm).toBeNull()
    expect(await order('asc')).toEqual([low.id, high.id, unseen.id])
    expect(await order('desc')).toEqual([high.id, low.id, unseen.id])
  })

  it('when a gateway answers 503 for the unreachable server, falls back to the copies on this device', async () => {
    await clearDevice()
    useSessionStore().user = makeUser({ id: 'u-1' })
    const kept = makeExam()
    await db.exams.put({ ...kept, ownerId: 'u-1' })
    vi.mocked(api.fetchExams).mockRejectedValue(httpError(503, 'unavailable', 'Service unavailable'))
    const store = useExamsStore()

    await store.loadList()

    expect(store.fromDevice).toBe(true)
    expect(store.exams.map((e) => e.id)).toEqual([kept.id])
  })

  it('online, marks the server’s rows whose later changes are still waiting on this device', async () => {
    await clearDevice()
    useSessionStore().user = makeUser({ id: 'u-1' })
    const edited = await save()
    const other = makeExam()
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([makeExam({ id: edited.id }), other]))
    const store = useExamsStore()

    await store.loadList()

    expect(store.fromDevice).toBe(false)
    expect(store.unsent).toEqual({ [edited.id]: 'pending' })
    expect(store.deviceSyncedAt).toBeNull()
  })

  it('with no network, opens the copy of an exam kept on this device', async () => {
    useSessionStore().user = makeUser({ id: 'u-1' })
    const exam = makeExam()
    await db.exams.put({ ...exam, ownerId: 'u-1' })
    vi.mocked(api.fetchExam).mockRejectedValue(new TypeError('Failed to fetch'))
    const store = useExamsStore()

    await store.loadExam(exam.id)

    expect(store.current?.id).toBe(exam.id)
  })

  it('when the server refuses, shows the refusal rather than the copies on this device', async () => {
    useSessionStore().user = makeUser({ id: 'u-1' })
    vi.mocked(api.fetchExams).mockRejectedValue(httpError(403, 'forbidden'))
    const store = useExamsStore()

    await expect(store.loadList()).rejects.toThrow()

    expect(store.fromDevice).toBe(false)
  })

  it('setting filters replaces the previous ones and returns to the first page', () => {
    const store = useExamsStore()
    store.setPaging({ page: 3, pageSize: 25, sort: 'examinedAt', order: 'desc' })
    store.setFilters({ status: 'draft', patientCode: 'SM-01' })

    store.setFilters({ patientCode: 'SM-02' })

    expect(store.query).toMatchObject({ patientCode: 'SM-02', status: undefined, page: 1 })
    expect(store.hasFilters).toBe(true)
  })

  it('reports whether the table paging changed, so an unchanged table does not reload', () => {
    const store = useExamsStore()

    const unchanged = store.setPaging({ page: 1, pageSize: 25, sort: 'examinedAt', order: 'desc' })
    const changed = store.setPaging({ page: 1, pageSize: 25, sort: 'cvpCmH2O', order: 'asc' })

    expect(unchanged).toBe(false)
    expect(changed).toBe(true)
    expect(store.query).toMatchObject({ sort: 'cvpCmH2O', order: 'asc' })
  })

  it('when an older list answer arrives after a newer one, keeps the newer rows', async () => {
    const older = makeExam({ patientCode: 'SM-OLD' })
    const newer = makeExam({ patientCode: 'SM-NEW' })
    let answerOlder: (value: ReturnType<typeof makeExamList>) => void = () => {}
    vi.mocked(api.fetchExams)
      .mockReturnValueOnce(new Promise((resolve) => (answerOlder = resolve)))
      .mockResolvedValueOnce(makeExamList([newer]))
    const store = useExamsStore()

    const first = store.loadList()
    await store.loadList()
    answerOlder(makeExamList([older]))
    await first

    expect(store.exams.map((exam) => exam.patientCode)).toEqual(['SM-NEW'])
    expect(store.loading).toBe(false)
  })

  it('submitting keeps the server copy on the detail page and in the log', async () => {
    const draft = makeExam()
    const submitted = { ...draft, status: 'submitted' as const, version: 2 }
    vi.mocked(api.fetchExams).mockResolvedValue(makeExamList([draft]))
    vi.mocked(api.fetchExam).mockResolvedValue(draft)
    vi.mocked(api.submitExam).mockResolvedValue(submitted)
    const store = useExamsStore()
    await store.loadList()
    await store.loadExam(draft.id)

    await store.submit(draft.id)

    expect(api.submitExam).toHaveBeenCalledWith(draft.id)
    expect(store.current?.status).toBe('submitted')
    expect(store.exams[0]?.version).toBe(2)
    expect(store.submitting).toBe(false)
  })
})

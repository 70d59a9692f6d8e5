import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import type { SyncResult } from '#shared/schemas/sync'
import { db } from '@/db'
import { loadDraft } from '@/db/drafts'
import { useExamDraftStore } from '@/stores/exam-draft'
import { useSessionStore } from '@/stores/session'
import { useSyncStore } from '@/stores/sync'
import { useSettingsStore } from '@/stores/settings'
import { lastChoices, pendingSubmits } from '@/utils/bedside-memory'
import { submitLater } from '@/stores/exam-save'
import * as sync from '@/api/sync'
import * as exams from '@/api/exams'
import { WORKED_EXAMPLE } from '../factories/draft'
import { makeUser } from '../factories/user'
import { httpError } from '../factories/http-error'
import { makeExam } from '../components/exam/make-exam'

vi.mock('@/api/sync', () => ({ pushChanges: vi.fn(), pullChanges: vi.fn() }))
vi.mock('@/api/settings')
vi.mock('@/api/exams', async (original) => ({ ...(await original<typeof import('@/api/exams')>()), submitExam: vi.fn() }))

const TEAMS = [{ id: 't-1', name: 'Cardiology A' }]
const PALPABLE = { ...WORKED_EXAMPLE.venousSigns, 'not-palpable': 'absent' } as const

function serverAnswers(answer: (id: string) => SyncResult) {
  vi.mocked(sync.pushChanges).mockImplementation(async (changes) => changes.map((change) => answer(change.exam.id)))
}

async function storeWithWorkedExample() {
  const store = useExamDraftStore()
  await store.startNew(TEAMS)
  store.update(WORKED_EXAMPLE)
  return store
}

describe('exam draft store: save and submit', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    localStorage.clear()
    await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear()])
    Object.assign(useSessionStore(), { user: makeUser({ id: 'u-1' }), token: 'token-of-u-1' })
    vi.mocked(sync.pushChanges).mockReset()
    vi.mocked(sync.pullChanges).mockReset().mockResolvedValue({ exams: [], cursor: 0, more: false })
    vi.mocked(exams.submitExam)
      .mockReset()
      .mockImplementation(async (id) => makeExam({ id, status: 'submitted' }))
    useSettingsStore().forget()
  })

  afterEach(() => useSyncStore().stop())

  it('online, saves through the outbox as "Save to my log" does, then submits the exam', async () => {
    const store = await storeWithWorkedExample()
    serverAnswers((id) => ({ id, result: 'applied', version: 1 }))

    const outcome = await store.saveAndSubmit()

    expect(outcome).toEqual({ kind: 'submitted', examId: store.draft!.id })
    expect(vi.mocked(sync.pushChanges).mock.calls[0]![0]).toEqual([
      expect.objectContaining({ exam: expect.objectContaining({ id: store.draft!.id }) }),
    ])
    expect(exams.submitExam).toHaveBeenCalledWith(store.draft!.id)
    expect(await db.outbox.count()).toBe(0)
    expect((await loadDraft(store.draft!.id))?.state).toBe('saved')
  })

  it('remembers the team and the angle for the next patient', async () => {
    const store = await storeWithWorkedExample()
    serverAnswers((id) => ({ id, result: 'applied', version: 1 }))

    await store.saveAndSubmit()

    expect(lastChoices()).toEqual({ teamId: 't-1', inclinationDeg: 45 })
  })

  it('offline, keeps the exam in the outbox and submits it once a later sync has sent it', async () => {
    const store = await storeWithWorkedExample()
    vi.mocked(sync.pushChanges).mockRejectedValue(new TypeError('Failed to fetch'))

    const outcome = await store.saveAndSubmit()

    expect(outcome).toEqual({ kind: 'submit-later' })
    expect(exams.submitExam).not.toHaveBeenCalled()
    expect(pendingSubmits()).toEqual([{ examId: store.draft!.id, authorId: 'u-1' }])
    expect(await db.outbox.count()).toBe(1)

    serverAnswers((id) => ({ id, result: 'applied', version: 1 }))
    await useSyncStore().syncNow()

    await vi.waitFor(() => expect(exams.submitExam).toHaveBeenCalledWith(store.draft!.id))
    await vi.waitFor(() => expect(pendingSubmits()).toEqual([]))
  })

  it('after a reload, a sync submits the exams left waiting without the recording page being opened', async () => {
    submitLater({ examId: 'e-waiting', authorId: 'u-1' })
    submitLater({ examId: 'e-of-someone-else', authorId: 'u-2' })

    await useSyncStore().syncNow()

    expect(exams.submitExam).toHaveBeenCalledTimes(1)
    expect(exams.submitExam).toHaveBeenCalledWith('e-waiting')
    expect(pendingSubmits()).toEqual([{ examId: 'e-of-someone-else', authorId: 'u-2' }])
  })

  it('when the server refuses the submission on a field, opens the exam again with the error on that field', async () => {
    const store = await storeWithWorkedExample()
    serverAnswers((id) => ({ id, result: 'applied', version: 1 }))
    const message = 'Confirm that the column you measured is venous before submitting'
    vi.mocked(exams.submitExam).mockRejectedValue(httpError(400, 'venous-not-confirmed', message, { venousConfirmed: message }))

    const outcome = await store.saveAndSubmit()

    expect(outcome.kind).toBe('invalid')
    expect(store.visibleErrors.venousConfirmed).toBe(message)
    expect(store.draft?.state).toBe('editing')
  })

  it('with arterial evidence and no confirmation, neither saves nor submits, and marks the confirmation', async () => {
    const store = await storeWithWorkedExample()
    store.update({ venousSigns: PALPABLE })

    const outcome = await store.saveAndSubmit()

    expect(outcome.kind).toBe('invalid')
    expect(store.visibleErrors.venousConfirmed).toMatch(/confirm that the column you measured is venous/)
    expect(sync.pushChanges).not.toHaveBeenCalled()
    expect(exams.submitExam).not.toHaveBeenCalled()
  })

  it('fills an untouched new exam with the team and angle last used here, but never a started one', async () => {
    localStorage.setItem('plumbline.record.last', JSON.stringify({ teamId: 't-1', inclinationDeg: 30 }))
    const store = useExamDraftStore()
    await store.startNew([...TEAMS, { id: 't-2', name: 'Acute Medical Unit' }])

    store.applyRemembered([...TEAMS, { id: 't-2', name: 'Acute Medical Unit' }])

    expect(store.draft?.fields).toMatchObject({ teamId: 't-1', inclinationDeg: 30, inclinationSource: 'entered' })
    store.update({ inclinationDeg: 60 })
    store.applyRemembered(TEAMS)
    expect(store.draft?.fields.inclinationDeg).toBe(60)
  })
})

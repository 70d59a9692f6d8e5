import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import type { SyncResult } from '#shared/schemas/sync'
import { db } from '@/db'
import { loadDraft } from '@/db/drafts'
import { useExamDraftStore } from '@/stores/exam-draft'
import { useSessionStore } from '@/stores/session'
import { useSyncStore } from '@/stores/sync'
import { useSettingsStore } from '@/stores/settings'
import * as sync from '@/api/sync'
import * as settingsApi from '@/api/settings'
import { DEFAULT_APP_SETTINGS } from '#shared/schemas/settings'
import { WORKED_EXAMPLE } from '../factories/draft'
import { makeUser } from '../factories/user'
import { makeExam } from '../components/exam/make-exam'

vi.mock('@/api/sync', () => ({ pushChanges: vi.fn(), pullChanges: vi.fn() }))
vi.mock('@/api/settings')

const TEAMS = [{ id: 't-1', name: 'Cardiology A' }]

function serverAnswers(answer: (id: string) => SyncResult) {
  vi.mocked(sync.pushChanges).mockImplementation(async (changes) => changes.map((change) => answer(change.exam.id)))
}

function refused(fields: Record<string, string>) {
  serverAnswers((id) => ({ id, result: 'rejected', error: { code: 'invalid-input', message: 'Some fields need attention', fields } }))
}

async function storeWithWorkedExample() {
  const store = useExamDraftStore()
  await store.startNew(TEAMS)
  store.update(WORKED_EXAMPLE)
  await store.goTo(4)
  return store
}

describe('exam draft store', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear()])
    Object.assign(useSessionStore(), { user: makeUser({ id: 'u-1' }), token: 'token-of-u-1' })
    vi.mocked(sync.pushChanges).mockReset()
    vi.mocked(sync.pullChanges).mockReset().mockResolvedValue({ exams: [], cursor: 0, more: false })
    useSettingsStore().forget()
  })

  afterEach(() => {
    vi.useRealTimers()
    useSyncStore().stop()
  })

  it('a new exam preselects the only team, starts now and is stored at once', async () => {
    const store = useExamDraftStore()

    await store.startNew(TEAMS)

    expect(store.draft?.fields.teamId).toBe('t-1')
    expect(store.draft?.fields.examinedAt).toMatch(/^\d{4}-\d{2}-\d{2}T/)
    expect(await loadDraft(store.draft!.id)).toBeDefined()
  })

  it('with several teams, leaves the team for the user to choose', async () => {
    const store = useExamDraftStore()

    await store.startNew([...TEAMS, { id: 't-2', name: 'Acute Medical Unit' }])

    expect(store.draft?.fields.teamId).toBeUndefined()
  })

  it('autosaves a change to IndexedDB within 300 ms', async () => {
    const store = useExamDraftStore()
    await store.startNew(TEAMS)
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] })

    store.update({ patientCode: 'SM-0142' })
    await vi.advanceTimersByTimeAsync(300)
    // A save still waiting on the fake clock now never runs.
    vi.useRealTimers()

    await expect.poll(async () => (await loadDraft(store.draft!.id))?.fields.patientCode).toBe('SM-0142')
  })

  it('after the app restarts, resumes the latest unsaved draft with its step', async () => {
    const first = await storeWithWorkedExample()
    const id = first.draft!.id
    await first.flush()

    setActivePinia(createPinia())
    const second = useExamDraftStore()
    await second.resumeOrStart(TEAMS)

    expect(second.draft?.id).toBe(id)
    expect(second.draft?.fields.heightCm).toBe(4)
    expect(second.step).toBe(4)
    expect(second.resumed).toBe(true)
  })

  it('a fresh exam shows no errors before the user tries to move on', async () => {
    const store = useExamDraftStore()

    await store.startNew(TEAMS)

    expect(store.visibleErrors).toEqual({})
  })

  it('shows a typed value\'s error at once', async () => {
    const store = useExamDraftStore()
    await store.startNew(TEAMS)

    store.update({ inclinationDeg: 95 })

    expect(store.visibleErrors.inclinationDeg).toBe('Inclination is at most 90° (upright)')
  })

  it('refuses to leave an invalid step and then shows its empty fields as errors', async () => {
    const store = useExamDraftStore()
    await store.startNew(TEAMS)

    const moved = await store.next()

    expect(moved).toBe(false)
    expect(store.step).toBe(0)
    expect(store.visibleErrors.patientCode).toBe('Enter the patient code')
    expect(store.visibleErrors.inclinationDeg).toBe('Enter the inclination in degrees')
  })

  it('computes the live estimate offline from the findings', async () => {
    const store = await storeWithWorkedExample()

    expect(store.estimate?.cvpCmH2O).toBeCloseTo(13.7, 5)
  })

  it('saving with an unanswered step sends nothing and jumps to that step with its errors shown', async () => {
    const store = await storeWithWorkedExample()
    store.update({ heightCm: null })

    const outcome = await store.saveToLog()

    expect(outcome).toEqual({ kind: 'invalid', step: 2 })
    expect(sync.pushChanges).not.toHaveBeenCalled()
    expect(await db.outbox.count()).toBe(0)
    expect(store.visibleErrors.heightCm).toBe('Enter the height of the column top above the sternal angle')
  })

  it('when the server acknowledges the exam, sends the draft id as a new exam, empties the outbox and marks the draft saved', async () => {
    const store = await storeWithWorkedExample()
    serverAnswers((id) => ({ id, result: 'applied', version: 1 }))

    const outcome = await store.saveToLog()

    expect(outcome).toEqual({ kind: 'saved', examId: store.draft!.id })
    const [changes, token] = vi.mocked(sync.pushChanges).mock.calls[0]!
    expect(changes).toEqual([{ exam: expect.objectContaining({ id: store.draft!.id, patientCode: 'SM-0142', heightCm: 4 }), baseVersion: null }])
    expect(token).toBe('token-of-u-1')
    expect(await db.outbox.count()).toBe(0)
    expect((await loadDraft(store.draft!.id))?.state).toBe('saved')
  })

  it('sends the band shown at review as the band reviewed, with its error term and settings version', async () => {
    // A local term from 40 routine pairs (σ_exam 1.2 cm) in force under settings version 3.
    const observerTerm = { source: 'local-pairs' as const, sigmaCm: 1.2, n: 40, ci: [0.98, 1.55] as [number, number] }
    vi.mocked(settingsApi.fetchSettings).mockResolvedValue({ version: 3, values: DEFAULT_APP_SETTINGS, changedAt: '2026-12-07T11:00:00.000Z', observerTerm })
    await useSettingsStore().load()
    const store = await storeWithWorkedExample()
    const shown = store.estimate!.bandCmH2O
    serverAnswers((id) => ({ id, result: 'applied', version: 1 }))

    await store.saveToLog()

    const [changes] = vi.mocked(sync.pushChanges).mock.calls[0]!
    expect(changes[0]!.exam.reviewed).toEqual({ bandCmH2O: shown, observerSource: 'local-pairs', settingsVersion: 3 })
    // Seth 2002 offset error 1.0 cm: σ = √(1.2² + 1.0²), band 13.7 ± 1.96σ.
    expect(shown![0]).toBeCloseTo(13.7 - 1.96 * Math.hypot(1.2, 1), 5)
  })

  // Cook & Simel 1996 (JAMA 275:630–634): a palpable pulsation behaves like the carotid.
  it('with a palpable pulsation recorded, saving waits on the review step until the column is confirmed venous', async () => {
    const store = await storeWithWorkedExample()
    store.update({ venousSigns: { ...WORKED_EXAMPLE.venousSigns, 'not-palpable': 'absent' } })
    serverAnswers((id) => ({ id, result: 'applied', version: 1 }))

    const refusedOutcome = await store.saveToLog()
    const error = store.visibleErrors.venousConfirmed
    store.update({ venousConfirmed: true })
    const outcome = await store.saveToLog()

    expect(refusedOutcome).toEqual({ kind: 'invalid', step: 4 })
    expect(error).toContain('confirm that the column you measured is venous')
    expect(outcome.kind).toBe('saved')
    const [changes] = vi.mocked(sync.pushChanges).mock.calls[0]!
    expect(changes[0]!.exam).toMatchObject({ venousConfirmed: true, venousSigns: { 'not-palpable': 'absent' } })
  })

  it('after a phone reading of the inclination, asks to confirm the trunk angle before leaving the first step', async () => {
    const store = useExamDraftStore()
    await store.startNew(TEAMS)
    store.update({ patientCode: 'SM-0142', inclinationDeg: 40, inclinationSource: 'sensor' })

    const before = await store.next()
    const error = store.visibleErrors.inclinationConfirmed
    store.update({ inclinationConfirmed: true })
    const after = await store.next()

    expect(before).toBe(false)
    expect(error).toContain('The phone measured the bed back')
    expect(after).toBe(true)
  })

  it('a column above the neck at 45° is accepted only once the examiner, asked to sit the patient up, confirms it', async () => {
    const store = await storeWithWorkedExample()
    store.update({ columnTop: 'above-neck' })
    await store.goTo(2)

    const before = await store.next()
    store.update({ aboveNeckConfirmedDeg: 45 })
    const after = await store.next()

    expect(before).toBe(false)
    expect(store.visibleErrors.aboveNeckConfirmedDeg).toBeUndefined()
    expect(after).toBe(true)
  })

  it('"no column even lying flat" at 30° is refused on the column top', async () => {
    const store = await storeWithWorkedExample()

    store.update({ inclinationDeg: 30, columnTop: 'not-filled', heightCm: null })

    expect(store.visibleErrors.columnTop).toContain('lower the bed and look again')
    expect(store.stepIsValid(2)).toBe(false)
  })

  it('a reading along the neck at 20° is refused, asking for a vertical ruler reading', async () => {
    const store = await storeWithWorkedExample()

    store.update({ inclinationDeg: 20, heightMethod: 'along-neck', alongNeckCm: 10 })

    expect(store.visibleErrors.heightMethod).toContain('hold a ruler vertical at the sternal angle')
  })

  it('a column not assessable sends its reason, and a reason left from before is not sent for a column seen', async () => {
    const store = await storeWithWorkedExample()
    store.update({ columnTop: 'not-assessable', notAssessableReason: 'ventilated' })
    vi.mocked(sync.pushChanges).mockRejectedValue(new TypeError('Failed to fetch'))

    await store.saveToLog()
    store.update({ columnTop: 'seen' })
    await store.saveToLog()

    const payloads = (await db.outbox.toArray()).map((item) => item.payload)
    expect(payloads[0]).toMatchObject({ columnTop: 'not-assessable', notAssessableReason: 'ventilated' })
    expect(payloads.at(-1)).toMatchObject({ columnTop: 'seen' })
    expect(payloads.at(-1)!.notAssessableReason ?? null).toBeNull()
    expect(await db.exams.get(store.draft!.id)).toMatchObject({ columnTop: 'seen' })
  })

  it('when the network fails, keeps the exam in the outbox and on this device, and the draft with it', async () => {
    const store = await storeWithWorkedExample()
    vi.mocked(sync.pushChanges).mockRejectedValue(new TypeError('Failed to fetch'))

    const outcome = await store.saveToLog()

    expect(outcome.kind).toBe('kept-offline')
    expect(await db.outbox.toArray()).toMatchObject([{ examId: store.draft!.id, authorId: 'u-1', state: 'pending', attempts: 1 }])
    expect(await db.exams.get(store.draft!.id)).toMatchObject({ patientCode: 'SM-0142', version: 0 })
    expect((await loadDraft(store.draft!.id))?.fields.heightCm).toBe(4)
  })

  it('when the server refuses a field, shows its error, jumps to the step holding it and lets the user save again', async () => {
    const store = await storeWithWorkedExample()
    refused({ examinedAt: 'The time of the exam cannot be in the future' })

    const outcome = await store.saveToLog()

    expect(outcome).toEqual({ kind: 'invalid', step: 0 })
    expect(store.step).toBe(0)
    expect(store.visibleErrors.examinedAt).toBe('The time of the exam cannot be in the future')
    expect(store.draft).toMatchObject({ state: 'editing', fields: { patientCode: 'SM-0142' } })
  })

  it('clears a server error once the user changes that field', async () => {
    const store = await storeWithWorkedExample()
    refused({ examinedAt: 'The time of the exam cannot be in the future' })
    await store.saveToLog()

    store.update({ examinedAt: '2026-01-01T08:00:00.000Z' })

    expect(store.visibleErrors.examinedAt).toBeUndefined()
  })

  it('saving again after a refusal replaces the refused change rather than queueing a second one', async () => {
    const store = await storeWithWorkedExample()
    refused({ examinedAt: 'The time of the exam cannot be in the future' })
    await store.saveToLog()
    vi.mocked(sync.pushChanges).mockRejectedValue(new TypeError('Failed to fetch'))

    store.update({ examinedAt: '2026-01-01T08:00:00.000Z' })
    await store.saveToLog()

    expect(await db.outbox.toArray()).toMatchObject([{ state: 'pending', payload: { examinedAt: '2026-01-01T08:00:00.000Z' } }])
  })

  it('when the exam changed on the server meanwhile, answers conflict and keeps both versions', async () => {
    const store = await storeWithWorkedExample()
    const theirs = { ...makeExam({ id: store.draft!.id }), heightCm: 2, version: 2 }
    serverAnswers((id) => ({ id, result: 'conflict', exam: theirs }))

    const outcome = await store.saveToLog()

    expect(outcome).toEqual({ kind: 'conflict' })
    expect(await db.outbox.toArray()).toMatchObject([{ state: 'conflict', payload: { heightCm: 4 }, serverCopy: { heightCm: 2, version: 2 } }])
  })

  it('when the device’s storage is full, says the exam was not queued and sends nothing', async () => {
    const store = await storeWithWorkedExample()
    vi.spyOn(db.outbox, 'add').mockRejectedValueOnce(new DOMException('The quota has been exceeded.', 'QuotaExceededError'))

    const outcome = await store.saveToLog()

    expect(outcome).toEqual({ kind: 'failed', message: 'Not queued for the server: this device has no storage space left for the app.' })
    expect(await db.outbox.count()).toBe(0)
    expect(await db.exams.count()).toBe(0)
    expect(sync.pushChanges).not.toHaveBeenCalled()
  })

  it('opens the user’s own exam kept on this device as a draft to change, on its review step', async () => {
    const exam = makeExam({ id: 'exam-1' })
    await db.exams.put({ ...exam, ownerId: 'u-1' })
    const store = useExamDraftStore()

    const opened = await store.open('exam-1')

    expect(opened).toBe(true)
    expect(store.draft).toMatchObject({ id: 'exam-1', state: 'saved', step: 4, fields: { patientCode: 'SM-0142', heightCm: 4 } })
  })

  it('an exam measured by phone with the top above the neck, reopened to change, does not ask again what was confirmed', async () => {
    const exam = makeExam({ id: 'exam-2', inclinationSource: 'sensor', columnTop: 'above-neck' })
    await db.exams.put({ ...exam, ownerId: 'u-1' })
    const store = useExamDraftStore()

    await store.open('exam-2')

    expect(store.errors.inclinationConfirmed).toBeUndefined()
    expect(store.errors.aboveNeckConfirmedDeg).toBeUndefined()
    expect(store.stepIsValid(0) && store.stepIsValid(2)).toBe(true)
  })

  it('does not open a countersigned exam to change it', async () => {
    await db.exams.put({ ...makeExam({ id: 'exam-1' }), status: 'countersigned', ownerId: 'u-1' })
    const store = useExamDraftStore()

    const opened = await store.open('exam-1')

    expect(opened).toBe(false)
  })
})

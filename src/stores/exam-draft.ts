import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { TeamRef } from '#shared/schemas/user'
import type { SyncItemError } from '#shared/schemas/sync'
import { newDraft, type DraftFields, type DraftRow } from '@/db/draft-schema'
import { listDrafts, loadDraft, saveDraft } from '@/db/drafts'
import { draftFromExam } from '@/db/exam-drafts'
import { loadLocalExam } from '@/db/local-exams'
import { lastChoices, rememberChoices } from '@/utils/bedside-memory'
import { queueAndSync, submitLater, submitSaved } from './exam-save'
import { defaultOffsetModelInUse, estimateBasisInUse } from './settings'
import { useSessionStore } from './session'
import { useSyncStore } from './sync'
import { BEDSIDE_STEPS, draftErrors, errorsToShow, liveEstimate, parseDraft, reviewedBand, stepOfField } from '@/utils/bedside-steps'

const AUTOSAVE_DELAY_MS = 250

export type SaveOutcome =
  | { kind: 'saved'; examId: string }
  | { kind: 'kept-offline' }
  | { kind: 'conflict' }
  | { kind: 'invalid'; step: number }
  | { kind: 'failed'; message: string }

/** A save followed by a submission: submitted now, or once the save reaches the server. */
export type SubmitOutcome = Exclude<SaveOutcome, { kind: 'saved' }> | { kind: 'submitted'; examId: string } | { kind: 'submit-later' }

const EDITABLE = new Set(['draft', 'returned'])

export const useExamDraftStore = defineStore('exam-draft', () => {
  const session = useSessionStore()
  const sync = useSyncStore()
  const draft = ref<DraftRow | null>(null)
  /** True when the open draft was picked up from an earlier visit. */
  const resumed = ref(false)
  /** Steps on which Next or Save was tried: their empty fields show errors too. */
  const attemptedSteps = ref<number[]>([])
  /** Field errors the server sent back, keyed by field path. */
  const serverErrors = ref<Record<string, string>>({})
  let timer: ReturnType<typeof setTimeout> | undefined

  const step = computed(() => draft.value?.step ?? 0)
  const errors = computed(() => (draft.value ? draftErrors(draft.value) : {}))
  const estimate = computed(() => (draft.value ? liveEstimate(draft.value, estimateBasisInUse()) : null))

  /** Errors to show: typed values at once, empty fields once their step was attempted, and the server's. */
  const visibleErrors = computed(() => ({
    ...errorsToShow(errors.value, draft.value?.fields ?? {}, attemptedSteps.value),
    ...serverErrors.value,
  }))

  /** True when the step's fields pass the shared schema. */
  function stepIsValid(index: number) {
    return Object.keys(errors.value).every((key) => stepOfField(key) !== index)
  }

  /** Writes the draft to IndexedDB now, cancelling any pending autosave. */
  async function flush() {
    clearTimeout(timer)
    timer = undefined
    if (draft.value) await saveDraft(draft.value)
  }

  function scheduleSave() {
    clearTimeout(timer)
    timer = setTimeout(() => void flush(), AUTOSAVE_DELAY_MS)
  }

  function openRow(row: DraftRow, wasResumed: boolean) {
    draft.value = row
    resumed.value = wasResumed
    attemptedSteps.value = []
    serverErrors.value = {}
  }

  /** Changes fields of the open draft and autosaves shortly after. */
  function update(patch: Partial<DraftFields>) {
    if (!draft.value) return
    Object.assign(draft.value.fields, patch)
    draft.value.state = 'editing'
    const changed = Object.keys(patch)
    serverErrors.value = Object.fromEntries(Object.entries(serverErrors.value).filter(([key]) => !changed.includes(key.split('.')[0]!)))
    draft.value.updatedAt = new Date().toISOString()
    scheduleSave()
  }

  /** Starts a new exam and stores it at once. */
  async function startNew(teams: readonly TeamRef[]) {
    await flush()
    openRow(newDraft(teams, defaultOffsetModelInUse()), false)
    await flush()
  }

  /** Opens the latest unsaved draft on this device, or starts a new one. */
  async function resumeOrStart(teams: readonly TeamRef[]) {
    await flush()
    const [latest] = await listDrafts('editing')
    if (latest) openRow(latest, true)
    else await startNew(teams)
  }

  /** The user's own exam kept on this device, as a draft to change, while it can still change. */
  async function draftOfLocalExam(id: string) {
    const exam = session.user ? await loadLocalExam(id, session.user.id) : undefined
    if (!exam || exam.examinerId !== exam.ownerId || !EDITABLE.has(exam.status)) return undefined
    const row = draftFromExam(exam)
    await saveDraft(row)
    return row
  }

  /** Opens one draft by id, or the user's exam of that id to change it; false when this device holds neither. */
  async function open(id: string) {
    await flush()
    const row = (await loadDraft(id)) ?? (await draftOfLocalExam(id))
    if (row) openRow(row, true)
    return row !== undefined
  }

  /** Moves to a step and saves immediately. */
  async function goTo(index: number) {
    if (!draft.value) return
    draft.value.step = index
    await flush()
  }

  /** Tries to leave the current step forward; stays (showing its errors) while it is invalid. */
  async function next() {
    if (!attemptedSteps.value.includes(step.value)) attemptedSteps.value.push(step.value)
    if (!stepIsValid(step.value)) return false
    await goTo(step.value + 1)
    return true
  }

  /** A change the server refused: back to editing, with its field errors on their step. */
  async function refused(error: SyncItemError | null): Promise<Extract<SaveOutcome, { kind: 'invalid' | 'failed' }>> {
    draft.value!.state = 'editing'
    await flush()
    const keys = Object.keys(error?.fields ?? {})
    if (!keys.length) return { kind: 'failed', message: error?.message ?? 'The server refused the exam.' }
    serverErrors.value = error!.fields!
    const first = Math.min(...keys.map(stepOfField))
    await goTo(first)
    return { kind: 'invalid', step: first }
  }

  /**
   * Saves the exam on this device and queues it for the server, then syncs; the draft stays on this device. The band
   * shown at review goes with it, so the server can say so should its own band differ.
   */
  async function saveToLog(): Promise<SaveOutcome> {
    const row = draft.value
    if (!row) return { kind: 'failed', message: 'No exam is open.' }
    const parsed = parseDraft(row)
    const shown = liveEstimate(row, estimateBasisInUse())
    const input = parsed && shown && !Object.keys(errors.value).length ? { ...parsed, reviewed: reviewedBand(shown) } : null
    if (!input) {
      attemptedSteps.value = BEDSIDE_STEPS.map((_, index) => index)
      const first = Math.min(...Object.keys(errors.value).map(stepOfField))
      await goTo(first)
      return { kind: 'invalid', step: first }
    }
    if (!session.user) return { kind: 'failed', message: 'Sign in to save the exam.' }
    await flush()
    const saved = await queueAndSync(row, input, session.user, () => sync.syncNow())
    if (saved.kind === 'not-stored') return { kind: 'failed', message: saved.message }
    rememberThisExam(row.fields)
    row.state = 'saved'
    return saved.kind === 'refused' ? refused(saved.error) : saved
  }

  /** Remembers the team and the angle on this device for the next patient (the quick screen offers them again). */
  function rememberThisExam(fields: DraftFields) {
    const angle = typeof fields.inclinationDeg === 'number' ? fields.inclinationDeg : undefined
    rememberChoices({ teamId: fields.teamId, inclinationDeg: angle })
  }

  /** Fills an untouched draft's team and angle with those last used on this device, when the user may still use them. */
  function applyRemembered(teams: readonly TeamRef[]) {
    const fields = draft.value?.fields
    if (!fields || fields.patientCode || fields.inclinationDeg != null) return
    const last = lastChoices()
    const team = teams.find((t) => t.id === last.teamId)
    const patch: Partial<DraftFields> = {}
    if (team && !fields.teamId) patch.teamId = team.id
    if (last.inclinationDeg !== undefined) Object.assign(patch, { inclinationDeg: last.inclinationDeg, inclinationSource: 'entered' })
    if (Object.keys(patch).length) update(patch)
  }

  /**
   * Saves the exam as "Save to my log" does (device, outbox, sync), then sends it for countersignature. Offline, the
   * submission waits for the save to reach the server; a submit check the server refuses comes back as a field error.
   */
  async function saveAndSubmit(): Promise<SubmitOutcome> {
    const saved = await saveToLog()
    if (saved.kind !== 'saved' && saved.kind !== 'kept-offline') return saved
    const later = { examId: draft.value!.id, authorId: session.user!.id }
    const result = saved.kind === 'saved' ? await submitSaved(saved.examId) : ({ kind: 'unreachable' } as const)
    if (result.kind === 'submitted') return { kind: 'submitted', examId: later.examId }
    if (result.kind === 'unreachable') {
      submitLater(later)
      return { kind: 'submit-later' }
    }
    return refused({ code: 'submit-refused', message: result.message, fields: result.fields })
  }

  return {
    draft,
    resumed,
    attemptedSteps,
    serverErrors,
    step,
    errors,
    estimate,
    visibleErrors,
    stepIsValid,
    flush,
    update,
    startNew,
    resumeOrStart,
    open,
    goTo,
    next,
    saveToLog,
    saveAndSubmit,
    applyRemembered,
    rememberThisExam,
  }
})

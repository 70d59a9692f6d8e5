import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { TeamRef } from '#shared/schemas/user'
import { newDraft, type DraftFields, type DraftRow } from '@/db/draft-schema'
import { listDrafts, loadDraft, saveDraft } from '@/db/drafts'
import { draftOfLocalExam } from './exam-draft-open'
import { rememberedPatch, rememberThisExam } from './exam-draft-remembered'
import { useDraftSubmit } from './exam-draft-submit'
import { defaultOffsetModelInUse, estimateBasisInUse } from './settings'
import { useSessionStore } from './session'
import { draftErrors, errorsToShow, liveEstimate, stepOfField } from '@/utils/bedside-steps'

export type { SaveOutcome, SubmitOutcome } from './exam-draft-submit'

const AUTOSAVE_DELAY_MS = 250

export const useExamDraftStore = defineStore('exam-draft', () => {
  const session = useSessionStore()
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

  /** Opens one draft by id, or the user's exam of that id to change it; false when this device holds neither. */
  async function open(id: string) {
    await flush()
    const row = (await loadDraft(id)) ?? (await draftOfLocalExam(id, session.user?.id))
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

  const { saveToLog, saveAndSubmit } = useDraftSubmit({ draft, errors, attemptedSteps, serverErrors, flush, goTo })

  /** Fills an untouched draft's team and angle with those last used on this device, when the user may still use them. */
  function applyRemembered(teams: readonly TeamRef[]) {
    const patch = rememberedPatch(draft.value?.fields, teams)
    if (Object.keys(patch).length) update(patch)
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

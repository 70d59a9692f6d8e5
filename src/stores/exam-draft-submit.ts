import type { ComputedRef, Ref } from 'vue'
import type { SyncItemError } from '#shared/schemas/sync'
import type { DraftRow } from '@/db/draft-schema'
import { BEDSIDE_STEPS, liveEstimate, parseDraft, reviewedBand, stepOfField } from '@/utils/bedside-steps'
import { rememberThisExam } from './exam-draft-remembered'
import { queueAndSync, submitLater, submitSaved } from './exam-save'
import { estimateBasisInUse } from './settings'
import { useSessionStore } from './session'
import { useSyncStore } from './sync'

export type SaveOutcome =
  | { kind: 'saved'; examId: string }
  | { kind: 'kept-offline' }
  | { kind: 'conflict' }
  | { kind: 'invalid'; step: number }
  | { kind: 'failed'; message: string }

/** A save followed by a submission: submitted now, or once the save reaches the server. */
export type SubmitOutcome = Exclude<SaveOutcome, { kind: 'saved' }> | { kind: 'submitted'; examId: string } | { kind: 'submit-later' }

/** What saving and submitting use of the draft store's state. */
export interface DraftSubmitState {
  draft: Ref<DraftRow | null>
  errors: ComputedRef<Record<string, string>>
  attemptedSteps: Ref<number[]>
  serverErrors: Ref<Record<string, string>>
  flush(): Promise<void>
  goTo(index: number): Promise<void>
}

/** The draft store's "Save to my log" and "Save and submit"; called inside its setup. */
export function useDraftSubmit(state: DraftSubmitState) {
  const session = useSessionStore()
  const sync = useSyncStore()
  const { draft, errors, attemptedSteps, serverErrors, flush, goTo } = state

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

  return { saveToLog, saveAndSubmit }
}

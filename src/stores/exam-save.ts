import type { ExamInput } from '#shared/schemas/exam'
import type { SyncItemError } from '#shared/schemas/sync'
import type { User } from '#shared/schemas/user'
import type { DraftRow } from '@/db/draft-schema'
import { outboxOf, queueSave } from '@/db/outbox'
import { storageProblem } from '@/db/storage-errors'
import { readApiError, serverUnreachable } from '@/api/client'
import { submitExam } from '@/api/exams'
import { pendingSubmits, setPendingSubmits, type PendingSubmit } from '@/utils/bedside-memory'
import { estimateBasisInUse } from './settings'

/** Where a saved exam stands once the sync that followed the save is over. */
export type QueuedSave =
  | { kind: 'saved'; examId: string }
  | { kind: 'kept-offline' }
  | { kind: 'conflict' }
  | { kind: 'refused'; error: SyncItemError | null }
  | { kind: 'not-stored'; message: string }

async function standing(examId: string, authorId: string): Promise<QueuedSave> {
  const item = (await outboxOf(authorId)).find((queued) => queued.examId === examId)
  if (!item) return { kind: 'saved', examId }
  if (item.state === 'pending') return { kind: 'kept-offline' }
  return item.state === 'conflict' ? { kind: 'conflict' } : { kind: 'refused', error: item.lastError }
}

/**
 * Stores the exam and its outbox change on this device in one transaction, then lets sync try to send it. Nothing is
 * lost when the server is out of reach: the change waits in the outbox.
 */
export async function queueAndSync(draft: DraftRow, input: ExamInput, author: User, sync: () => Promise<void>): Promise<QueuedSave> {
  try {
    await queueSave(draft, input, author, estimateBasisInUse())
  } catch (e) {
    return { kind: 'not-stored', message: storageProblem(e) }
  }
  await sync()
  return standing(input.id, author.id)
}

/** Where a submission stands: sent for countersignature, waiting for the network, or refused with the server's reasons. */
export type SubmitResult =
  { kind: 'submitted' } | { kind: 'unreachable' } | { kind: 'refused'; message: string; fields: Record<string, string> }

/** Sends a saved exam for countersignature; the server runs the same submit checks as from the exam page. */
export async function submitSaved(examId: string): Promise<SubmitResult> {
  try {
    await submitExam(examId)
    return { kind: 'submitted' }
  } catch (e) {
    if (serverUnreachable(e)) return { kind: 'unreachable' }
    const { message, fields } = await readApiError(e)
    return { kind: 'refused', message, fields }
  }
}

/**
 * Submits the exams saved with "Save and submit" while the server was out of reach, once their save has left the
 * outbox; an exam the server refuses stays a draft in the author's log, where the exam page offers Submit again.
 */
export async function submitWaiting(authorId: string): Promise<void> {
  const waiting = pendingSubmits()
  if (!waiting.some((item) => item.authorId === authorId)) return
  const queued = new Set((await outboxOf(authorId)).map((item) => item.examId))
  const kept: PendingSubmit[] = []
  for (const item of waiting) {
    const due = item.authorId === authorId && !queued.has(item.examId)
    if (!due || (await submitSaved(item.examId)).kind === 'unreachable') kept.push(item)
  }
  setPendingSubmits(kept)
}

/** Remembers that the exam is to be submitted as soon as its save reaches the server. */
export function submitLater(item: PendingSubmit): void {
  setPendingSubmits([...pendingSubmits().filter((other) => other.examId !== item.examId), item])
}

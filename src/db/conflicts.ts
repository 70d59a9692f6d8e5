import { ExamInputSchema, type Exam, type ExamInput } from '#shared/schemas/exam'
import { draftFromExam } from './exam-drafts'
import { DraftRowSchema } from './draft-schema'
import { db } from './index'
import { plain } from './local-exams'
import { outboxOf } from './outbox'
import type { OutboxItem } from './sync-schema'

/** One exam changed both here and on the server, as the conflict screen shows it. */
export interface Conflict {
  seq: number
  mine: ExamInput
  theirs: Exam
}

/** Only a draft or a returned exam can still change; a submitted or countersigned one is never overwritten. */
export function canKeepMine(theirs: Exam): boolean {
  return theirs.status === 'draft' || theirs.status === 'returned'
}

function conflictOf(item: OutboxItem): Conflict | null {
  const mine = ExamInputSchema.safeParse(item.payload)
  return item.state === 'conflict' && item.serverCopy && mine.success ? { seq: item.seq, mine: mine.data, theirs: item.serverCopy } : null
}

export async function listConflicts(authorId: string): Promise<Conflict[]> {
  return (await outboxOf(authorId)).map(conflictOf).filter((c): c is Conflict => c !== null)
}

/** Sends the local version again as a change on top of the server's; refused when the server's can no longer change. */
export async function keepMine(seq: number): Promise<boolean> {
  return db.transaction('rw', db.outbox, async () => {
    const item = await db.outbox.get(seq)
    if (item?.state !== 'conflict' || !item.serverCopy || !canKeepMine(item.serverCopy)) return false
    const change = { state: 'pending' as const, baseVersion: item.serverCopy.version, serverCopy: null, lastError: null, attempts: 0 }
    await db.outbox.update(seq, change)
    return true
  })
}

/** Drops the local version: the server's copy replaces it here, in the exam list and in the draft. */
export async function takeServer(seq: number): Promise<void> {
  await db.transaction('rw', db.outbox, db.exams, db.drafts, async () => {
    const item = await db.outbox.get(seq)
    if (item?.state !== 'conflict' || !item.serverCopy) return
    await db.outbox.delete(seq)
    await db.exams.put(plain({ ...item.serverCopy, ownerId: item.authorId }))
    const draft = DraftRowSchema.safeParse(await db.drafts.get(item.examId))
    if (draft.success) await db.drafts.put(plain(draftFromExam(item.serverCopy, draft.data)))
  })
}

/** A change the server refused, waiting for the user to fix the exam and save it again. */
export interface Refusal {
  seq: number
  examId: string
  patientCode: string
  message: string
  fields: Record<string, string>
}

export async function listRefusals(authorId: string): Promise<Refusal[]> {
  return (await outboxOf(authorId))
    .filter((item) => item.state === 'needs-attention')
    .map((item) => ({
      seq: item.seq,
      examId: item.examId,
      patientCode: String(item.payload.patientCode ?? ''),
      message: item.lastError?.message ?? 'The server refused this exam.',
      fields: item.lastError?.fields ?? {},
    }))
}

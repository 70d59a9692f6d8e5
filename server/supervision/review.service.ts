import type { Exam } from '#shared/schemas/exam'
import type { AmendInput, ReturnInput } from '#shared/schemas/signature'
import type { User } from '#shared/schemas/user'
import { snapshotOf } from '../exams/exam-changes.ts'
import { presentOwn } from '../exams/exam-record.ts'
import { authoredRow, checkBaseVersion, conflict, inTransaction, saveChange } from '../exams/exam-writes.ts'
import type { Notifier } from './notifications.ts'
import { checkSubmitted, reviewedRow } from './review-access.ts'
import { supersedeSignature } from './signatures.ts'

const AMENDABLE = new Set(['returned', 'countersigned'])

/**
 * Sends a submitted exam back to its author with the reviewer's comment; the author amends and resubmits. The author's
 * e-mail is queued in the same transaction.
 */
export async function returnExam(reviewer: User, id: string, input: ReturnInput, notifier?: Notifier): Promise<Exam> {
  const row = await inTransaction(async (transaction) => {
    const row = await reviewedRow(reviewer, id, transaction)
    await checkSubmitted(row, input.baseVersion)
    const before = snapshotOf(row)
    row.set({ status: 'returned', returnComment: input.comment })
    const saved = await saveChange(reviewer, row, 'exam-return', transaction, before)
    await notifier?.returned(saved, reviewer, transaction)
    return saved
  })
  return presentOwn(row)
}

/**
 * Reopens a returned or countersigned exam as a draft of a new version. A countersignature is bound to the version
 * it signed, so it is marked superseded and kept (21 CFR 11.70); the return comment stays until resubmission.
 */
export async function amendExam(author: User, id: string, input: AmendInput): Promise<Exam> {
  const row = await inTransaction(async (transaction) => {
    const row = await authoredRow(author, id, transaction)
    if (!AMENDABLE.has(row.status))
      throw await conflict(row, 'not-amendable', `This exam is ${row.status}; only a returned or countersigned exam can be amended`)
    await checkBaseVersion(row, input.baseVersion)
    const before = snapshotOf(row)
    const superseded = row.status === 'countersigned' ? await supersedeSignature(row.id, transaction) : null
    row.set({ status: 'draft' })
    const more = superseded ? { signatureSuperseded: { from: null, to: superseded } } : {}
    return saveChange(author, row, 'exam-amend', transaction, before, more)
  })
  return presentOwn(row)
}

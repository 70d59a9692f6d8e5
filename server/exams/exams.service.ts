import { ExamInputSchema, type Exam, type ExamInput, type ExamPatch } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { AppError, invalidInput } from '../errors.ts'
import type { Transaction } from 'sequelize'
import { ExamModel } from '../models/index.ts'
import { changesBetween, snapshotOf } from './exam-changes.ts'
import { columnsOf, isRetryOf, presentOwn, storedInput } from './exam-record.ts'
import { invalidateObserverTerm } from '../agreement/observer-term.ts'
import { derivePairs } from '../agreement/pair-derivation.ts'
import { estimateContext } from '../settings/settings-estimate.ts'
import { roundFieldErrors } from '../rounds/round-membership.ts'
import { authorFieldErrors, isEditable } from './exam-rules.ts'
import { authoredRow, checkBaseVersion, conflict, inTransaction, saveChange } from './exam-writes.ts'
import { savedEstimate } from './saved-estimate.ts'
import { checkVenousConfirmed } from './submit-checks.ts'

/** The author rules (exam-rules.ts) and the round's, as one 400. */
function checkAuthorFields(author: User, input: ExamInput, before: ExamModel | null, more: Record<string, string> = {}): void {
  const fields = { ...more, ...authorFieldErrors(author, input, before) }
  if (Object.keys(fields).length) throw invalidInput(fields)
}

/** A new draft by the signed-in author. The same id sent again by its author with the same content is an offline retry. */
export async function createExam(author: User, input: ExamInput): Promise<{ exam: Exam; created: boolean }> {
  // Read before the write transaction: the settings in force and the local observer spread come from other rows.
  const context = await estimateContext()
  return inTransaction(async (transaction) => {
    const existing = await ExamModel.findByPk(input.id, { transaction })
    if (existing && isRetryOf(existing, author, input))
      return { exam: await presentOwn(existing), created: false }
    if (existing) throw new AppError('id-taken', 409, 'Another exam already has this id')
    checkAuthorFields(author, input, null, await roundFieldErrors(author, input, null, transaction))
    const values = { id: input.id, examinerId: author.id, status: 'draft', version: 1, submittedAt: null }
    const row = await ExamModel.create({ ...values, ...columnsOf(input, savedEstimate(input, context)) }, { transaction })
    await derivePairs([row.patientCode], { sequelize: row.sequelize, transaction })
    const changes = changesBetween(null, snapshotOf(row))
    await audit({ actorId: author.id, action: 'exam-create', entityType: 'exam', entityId: row.id, changes }, { transaction })
    return { exam: await presentOwn(row), created: true }
  })
}

/** Drafts and returned exams can change; submitted and countersigned ones are locked. */
async function checkEditable(row: ExamModel, baseVersion: number | undefined): Promise<void> {
  if (!isEditable(row.status)) throw await conflict(row, 'exam-locked', `This exam is ${row.status} and can no longer be changed`)
  await checkBaseVersion(row, baseVersion)
}

/** Merges a change into the author's draft and re-validates the whole record; a change that changes nothing keeps the version. */
export async function updateExam(author: User, id: string, patch: ExamPatch): Promise<Exam> {
  const context = await estimateContext()
  return inTransaction(async (transaction) => {
    const row = await authoredRow(author, id, transaction)
    await checkEditable(row, patch.baseVersion)
    const { baseVersion: _base, ...change } = patch
    const stored = storedInput(row)
    const input = ExamInputSchema.parse({ ...stored, ...change, waveform: { ...(stored.waveform as object), ...change.waveform } })
    checkAuthorFields(author, input, row, await roundFieldErrors(author, input, row, transaction))
    const before = snapshotOf(row)
    const storedEstimate = row.estimate
    row.set(columnsOf(input, savedEstimate(input, context)))
    // Nothing changed: keep the estimate as computed, never re-evaluated under settings saved since.
    if (!Object.keys(changesBetween(before, snapshotOf(row))).length) return row.set({ estimate: storedEstimate })
    return saveChange(author, row, 'exam-update', transaction, before)
  }).then(presentOwn)
}

/** Sends a draft or returned exam for countersignature, stamped with the server's time. */
/** What is told of a submission inside its transaction (the countersign request e-mail), so both commit or neither. */
export type SubmitNotice = (row: ExamModel, transaction: Transaction) => Promise<void>

export async function submitExam(author: User, id: string, baseVersion?: number, notice?: SubmitNotice): Promise<Exam> {
  return inTransaction(async (transaction) => {
    const row = await authoredRow(author, id, transaction)
    await checkEditable(row, baseVersion)
    checkVenousConfirmed(row)
    const before = snapshotOf(row)
    row.set({ status: 'submitted', submittedAt: new Date(), returnComment: null })
    const saved = await saveChange(author, row, 'exam-submit', transaction, before)
    await notice?.(saved, transaction)
    return saved
  })
    .then((row) => {
      // A submitted exam may form a new pair, which moves the local observer spread.
      invalidateObserverTerm()
      return row
    })
    .then(presentOwn)
}

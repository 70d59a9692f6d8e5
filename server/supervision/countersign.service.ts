import { Op, type Transaction } from 'sequelize'
import type { Exam } from '#shared/schemas/exam'
import type { CountersignInput, Signature } from '#shared/schemas/signature'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { verifyPassword } from '../auth/passwords.ts'
import { AppError } from '../errors.ts'
import { changesBetween, snapshotOf } from '../exams/exam-changes.ts'
import { presentOwn } from '../exams/exam-record.ts'
import { inTransaction } from '../exams/exam-writes.ts'
import { ATTEMPT_WINDOW_MS } from '../middleware/rate-limit.ts'
import { AuditEventModel, UserModel, type ExamModel } from '../models/index.ts'
import { invalidateObserverTerm } from '../agreement/observer-term.ts'
import { estimateContext } from '../settings/settings-estimate.ts'
import { readingTime, teachingAudit, teachingFor, type ReadingTimes } from './attending-reading.ts'
import type { Notifier } from './notifications.ts'
import { checkSubmitted, reviewedRow } from './review-access.ts'
import { recordSignature } from './signatures.ts'

export const COUNTERSIGN_FAILED = 'exam-countersign-failed'
// ASVS 2.2.1: the signing password must not be guessable through this door either; counted over the sign-in window.
const MAX_FAILURES = 5

/** 21 CFR 11.200(a): every signing is a full authentication, checked by the server at the moment of signing. */
async function checkPassword(signer: User, examId: string, password: string): Promise<void> {
  const since = new Date(Date.now() - ATTEMPT_WINDOW_MS)
  const failures = await AuditEventModel.count({ where: { actorId: signer.id, action: COUNTERSIGN_FAILED, at: { [Op.gte]: since } } })
  if (failures >= MAX_FAILURES) throw new AppError('too-many-attempts', 429, 'Too many wrong passwords; wait 15 minutes before signing')
  const account = await UserModel.findByPk(signer.id)
  if (await verifyPassword(password, account?.passwordHash ?? null)) return
  const failure = { actorId: signer.id, action: COUNTERSIGN_FAILED, entityType: 'exam', entityId: examId }
  await audit({ ...failure, changes: { reason: 'wrong-password' } })
  throw new AppError('signature-password', 401, 'The password is not right; the exam was not signed')
}

export interface Countersigned {
  exam: Exam
  signature: Signature
}

/**
 * Signs the submitted version as it stands and locks it; the version number stays, since the content does not change.
 * The author's e-mail is queued in the signing transaction.
 */
export async function countersignExam(signer: User, id: string, input: CountersignInput, notifier?: Notifier): Promise<Countersigned> {
  const signedAt = new Date()
  const examinedAt = input.attendingReading ? readingTime(input.attendingReading, signedAt) : signedAt
  // Checked before the slow password hash, and again under the write lock in case the exam moved meanwhile.
  await checkSubmitted(await reviewedRow(signer, id), input.baseVersion)
  await checkPassword(signer, id, input.password)
  const context = await estimateContext()
  const row = await inTransaction(async (transaction) => {
    const row = await reviewedRow(signer, id, transaction)
    await checkSubmitted(row, input.baseVersion)
    return applyCountersignature(signer, row, input, { signedAt, examinedAt, context }, transaction, notifier)
  })
  // The reading may form a new pair, which moves the local observer spread.
  if (input.attendingReading) invalidateObserverTerm()
  const exam = await presentOwn(row)
  return { exam, signature: exam.signatures!.at(-1)! }
}

/**
 * Locks the checked, submitted row as countersigned with the signature, the attending's reading and the feedback,
 * audits it and queues the author's e-mail, in the caller's transaction. The password was checked by the caller.
 */
export async function applyCountersignature(
  signer: User,
  row: ExamModel,
  input: Omit<CountersignInput, 'password'>,
  at: ReadingTimes,
  transaction: Transaction,
  notifier?: Notifier,
): Promise<ExamModel> {
  const before = snapshotOf(row)
  row.status = 'countersigned'
  await row.save({ transaction })
  const s = await recordSignature(row, signer, input.meaning, transaction, await teachingFor(signer, row, input, at, transaction))
  const signature = {
    from: null,
    to: { id: s.id, meaning: s.meaning, examVersion: s.examVersion, hash: s.contentHash, ...teachingAudit(s) },
  }
  const changes = { ...changesBetween(before, snapshotOf(row)), signature }
  await audit({ actorId: signer.id, action: 'exam-countersign', entityType: 'exam', entityId: row.id, changes }, { transaction })
  await notifier?.countersigned(row, s, transaction)
  return row
}

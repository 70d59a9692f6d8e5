import { randomUUID } from 'node:crypto'
import type { Transaction } from 'sequelize'
import { ExamInputSchema } from '#shared/schemas/exam'
import type { AttendingReading, CountersignInput } from '#shared/schemas/signature'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { derivePairs } from '../agreement/pair-derivation.ts'
import { invalidInput } from '../errors.ts'
import { changesBetween, snapshotOf } from '../exams/exam-changes.ts'
import { columnsOf } from '../exams/exam-columns.ts'
import { FUTURE_TOLERANCE_MS } from '../exams/exam-rules.ts'
import { savedEstimate } from '../exams/saved-estimate.ts'
import { ExamModel, type SignatureModel } from '../models/index.ts'
import type { EstimateContext } from '../settings/settings-estimate.ts'

/** When the attending signed and examined, and the estimate settings the reading is computed under. */
export interface ReadingTimes {
  examinedAt: Date
  signedAt: Date
  context: EstimateContext
}

/** The reading's time: the attending's own, or the time of signing; never in the future by the server's clock. */
export function readingTime(reading: AttendingReading, signedAt: Date): Date {
  const at = reading.examinedAt ? new Date(reading.examinedAt) : signedAt
  if (at.getTime() > Date.now() + FUTURE_TOLERANCE_MS)
    throw invalidInput({ 'attendingReading.examinedAt': 'The time of your exam cannot be in the future' })
  return at
}

/**
 * Stores the attending's reading as their own exam of the same patient (same code, team, vein and offset model; the
 * column top seen, a vertical height read with a ruler), submitted at once: an attending's exam needs no
 * countersignature, and the sign-off queue leaves readings out. Its patient's pairs are derived again in the same
 * transaction, so the reading pairs with the resident's exam like any other.
 */
export async function recordReading(
  signer: User,
  exam: ExamModel,
  reading: AttendingReading,
  at: ReadingTimes,
  transaction: Transaction,
): Promise<ExamModel> {
  const input = ExamInputSchema.parse({
    id: randomUUID(),
    patientCode: exam.patientCode,
    teamId: exam.teamId,
    examinedAt: at.examinedAt.toISOString(),
    inclinationDeg: reading.inclinationDeg,
    vein: exam.vein,
    columnTop: 'seen',
    heightMethod: 'vertical',
    heightCm: reading.heightCm,
    readingPrecision: 'ruler',
    offsetModel: exam.offsetModel,
  })
  const values = { id: input.id, examinerId: signer.id, status: 'submitted', version: 1, submittedAt: at.signedAt }
  const row = await ExamModel.create({ ...values, ...columnsOf(input, savedEstimate(input, at.context)) }, { transaction })
  await derivePairs([row.patientCode], { sequelize: row.sequelize, transaction })
  const changes = { ...changesBetween(null, snapshotOf(row)), readingFor: { from: null, to: exam.id } }
  await audit({ actorId: signer.id, action: 'exam-create', entityType: 'exam', entityId: row.id, changes }, { transaction })
  return row
}

/** The attending's reading (its own exam) and the feedback, stored beside the signature; not part of the signed content. */
export async function teachingFor(
  signer: User,
  row: ExamModel,
  input: Omit<CountersignInput, 'password'>,
  at: ReadingTimes,
  transaction: Transaction,
) {
  const reading = input.attendingReading && (await recordReading(signer, row, input.attendingReading, at, transaction))
  return { signedAt: at.signedAt, readingExamId: reading?.id ?? null, feedback: input.feedback, feedbackText: input.feedbackText }
}

/** The reading and feedback in the audit event, only when given. */
export function teachingAudit(s: SignatureModel) {
  return {
    ...(s.readingExamId ? { readingExamId: s.readingExamId } : {}),
    ...(s.feedback ? { feedback: JSON.parse(s.feedback) as unknown } : {}),
    ...(s.feedbackText ? { feedbackText: s.feedbackText } : {}),
  }
}

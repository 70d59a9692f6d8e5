import { randomUUID } from 'node:crypto'
import { Op, type Transaction } from 'sequelize'
import { SignatureSchema, type FeedbackCode, type Signature, type SignatureMeaning } from '#shared/schemas/signature'
import type { User } from '#shared/schemas/user'
import { ExamModel, SignatureModel } from '../models/index.ts'
import { teachingOf } from './signature-teaching.ts'
import { sha256, signedContent } from './signed-content.ts'
import { isoInZone, serverTimeZone } from './time-zone.ts'

/** What a signature carries beside the signed content: the attending's reading and teaching feedback, never hashed. */
export interface SignatureTeaching {
  signedAt?: Date
  readingExamId?: string | null
  feedback?: readonly FeedbackCode[]
  feedbackText?: string | null
}

/** Binds a new signature to the row's current version, stamped with the server's clock. */
export async function recordSignature(
  row: ExamModel,
  signer: User,
  meaning: SignatureMeaning,
  transaction: Transaction,
  teaching: SignatureTeaching = {},
) {
  const content = signedContent(row)
  return SignatureModel.create(
    {
      id: randomUUID(),
      examId: row.id,
      examVersion: row.version,
      signerId: signer.id,
      signerName: signer.displayName,
      meaning,
      signedAt: teaching.signedAt ?? new Date(),
      content,
      contentHash: sha256(content),
      supersededAt: null,
      readingExamId: teaching.readingExamId ?? null,
      feedback: teaching.feedback?.length ? JSON.stringify(teaching.feedback) : null,
      feedbackText: teaching.feedbackText || null,
    },
    { transaction },
  )
}

/** Marks the exam's current signature superseded (it stays on record) and answers its id, if there was one. */
export async function supersedeSignature(examId: string, transaction: Transaction): Promise<string | null> {
  const current = await SignatureModel.findOne({ where: { examId, supersededAt: null }, transaction })
  if (!current) return null
  await SignatureModel.update({ supersededAt: new Date() }, { where: { id: current.id, supersededAt: null }, transaction })
  return current.id
}

/**
 * Whether the signed content still matches the stored hash. A current signature is checked against the live row,
 * so a change made behind the application's back shows; a superseded one against the copy it kept.
 */
export function verifySignature(signature: SignatureModel, row: ExamModel): boolean {
  const content = signature.supersededAt ? signature.content : signedContent(row)
  return signature.examId === row.id && sha256(content) === signature.contentHash
}

export function manifestation(signature: SignatureModel, row: ExamModel, timeZone = serverTimeZone(), reading?: ExamModel): Signature {
  return SignatureSchema.parse({
    id: signature.id,
    examId: signature.examId,
    examVersion: signature.examVersion,
    signerId: signature.signerId,
    signerName: signature.signerName,
    meaning: signature.meaning,
    signedAt: isoInZone(signature.signedAt, timeZone),
    timeZone,
    hash: signature.contentHash,
    superseded: signature.supersededAt !== null,
    supersededAt: signature.supersededAt && isoInZone(signature.supersededAt, timeZone),
    valid: verifySignature(signature, row),
    ...teachingOf(signature, row, reading),
  })
}

/** Every signature of the rows, verified, oldest first, by exam id. */
export async function signaturesOf(rows: ExamModel[]): Promise<Map<string, Signature[]>> {
  const byId = new Map(rows.map((r) => [r.id, r]))
  const signatures = await SignatureModel.findAll({
    where: { examId: { [Op.in]: [...byId.keys()] } },
    order: [['signedAt', 'ASC'], ['id', 'ASC']],
  })
  const readingIds = signatures.flatMap((s) => (s.readingExamId ? [s.readingExamId] : []))
  const readings = readingIds.length ? await ExamModel.findAll({ where: { id: { [Op.in]: readingIds } } }) : []
  const readingById = new Map(readings.map((r) => [r.id, r]))
  const result = new Map<string, Signature[]>()
  for (const s of signatures) {
    const signature = manifestation(s, byId.get(s.examId)!, undefined, s.readingExamId ? readingById.get(s.readingExamId) : undefined)
    result.set(s.examId, [...(result.get(s.examId) ?? []), signature])
  }
  return result
}

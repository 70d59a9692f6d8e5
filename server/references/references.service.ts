import { randomUUID } from 'node:crypto'
import { mmHgToCmH2O, withoutFloatNoise } from '#shared/domain/units'
import type { Reference, ReferenceInput, ReferenceList } from '#shared/schemas/reference'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { AppError, invalidInput } from '../errors.ts'
import { readableRow } from '../exams/exam-queries.ts'
import { FUTURE_TOLERANCE_MS, isAuthor } from '../exams/exam-rules.ts'
import { canRead, examNotFound, inTransaction } from '../exams/exam-writes.ts'
import { ExamModel, ReferenceModel } from '../models/index.ts'
import { belongsTo } from '../users/team-members.ts'
import { presentReferences, referencesOf } from './reference-records.ts'

/**
 * Who may record a measured pressure beside an exam: whoever may edit or countersign it (its author, an attending of
 * its team), at any status, as the reference is not part of the signed content. Others who read it get 403, anyone
 * else 404.
 */
async function referencedExam(user: User, examId: string): Promise<ExamModel> {
  const row = await ExamModel.findByPk(examId)
  if (!row || !(await canRead(user, examId))) throw examNotFound()
  if (isAuthor(row, user) || (user.roles.includes('attending') && belongsTo(user, row.teamId))) return row
  throw new AppError('not-exam-clinician', 403, 'Only the exam’s author or an attending of its team can add a measured pressure')
}

const toCmH2O = (input: ReferenceInput) => (input.unit === 'cmH2O' ? input.value : withoutFloatNoise(mmHgToCmH2O(input.value)))

/** Stores one measured pressure beside the exam, converted to cmH₂O, and audits it on the exam. */
export async function addReference(user: User, examId: string, input: ReferenceInput): Promise<Reference> {
  const exam = await referencedExam(user, examId)
  const measuredAt = new Date(input.measuredAt)
  if (measuredAt.getTime() > Date.now() + FUTURE_TOLERANCE_MS)
    throw invalidInput({ measuredAt: 'The time of the measurement cannot be in the future' })
  const values = { id: randomUUID(), examId, kind: input.kind, value: input.value, unit: input.unit, valueCmH2O: toCmH2O(input) }
  const row = await inTransaction(async (transaction) => {
    const row = await ReferenceModel.create({ ...values, measuredAt, addedById: user.id, addedAt: new Date() }, { transaction })
    const changes = { reference: { from: null, to: { ...values, measuredAt: measuredAt.toISOString() } } }
    await audit({ actorId: user.id, action: 'reference-add', entityType: 'exam', entityId: examId, changes }, { transaction })
    return row
  })
  const [reference] = await presentReferences([row], [exam])
  return reference!
}

/** The exam's references, for anyone who may read the exam. */
export async function listReferences(user: User, examId: string): Promise<ReferenceList> {
  const { row } = await readableRow(user, examId)
  return { references: await referencesOf([row]) }
}

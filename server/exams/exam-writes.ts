import { Op, type Transaction } from 'sequelize'
import type { User } from '#shared/schemas/user'
import { audit } from '../audit.ts'
import { writeTransaction } from '../db/transaction.ts'
import { AppError } from '../errors.ts'
import { ExamModel } from '../models/index.ts'
import { derivePairs } from '../agreement/pair-derivation.ts'
import { readable, scopeOf } from './exam-access.ts'
import { changesBetween, snapshotOf } from './exam-changes.ts'
import { presentOwn } from './exam-record.ts'
import { isAuthor } from './exam-rules.ts'

// IMMEDIATE takes the write lock up front, so two writes to one exam cannot interleave between check and save.
export function inTransaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  return writeTransaction(ExamModel.sequelize!, work)
}

/** Whether the user may read the row at all; who may not gets 404, so existence is not disclosed. */
export async function canRead(user: User, id: string, transaction?: Transaction): Promise<boolean> {
  const where = readable(await scopeOf(user))
  return !!where && (await ExamModel.count({ where: { [Op.and]: [{ id }, where] }, transaction })) > 0
}

export const examNotFound = () => new AppError('exam-not-found', 404, 'No such exam')

/** The author's exam; a reader who is not its author gets 403, anyone else 404. */
export async function authoredRow(author: User, id: string, transaction: Transaction): Promise<ExamModel> {
  const row = await ExamModel.findByPk(id, { transaction })
  if (row && isAuthor(row, author)) return row
  if (row && (await canRead(author, id, transaction))) throw new AppError('not-author', 403, 'Only the author can change this exam')
  throw examNotFound()
}

/** A 409 carrying the server's copy, so an offline client can show it instead of overwriting. */
export async function conflict(row: ExamModel, code: string, message: string): Promise<AppError> {
  return new AppError(code, 409, message, undefined, { exam: await presentOwn(row) })
}

export async function checkBaseVersion(row: ExamModel, baseVersion: number | undefined): Promise<void> {
  if (baseVersion !== undefined && baseVersion !== row.version)
    throw await conflict(row, 'stale-version', 'This exam changed after your copy was loaded')
}

/**
 * Saves the row as a new version, derives its patient's agreement pairs again and appends one audit event with the
 * before/after of what changed (and `more`).
 */
export async function saveChange(
  actor: User,
  row: ExamModel,
  action: string,
  transaction: Transaction,
  before = snapshotOf(row),
  more: Record<string, unknown> = {},
) {
  // The code it had and the code it has: a change of patient code moves the exam from one patient's pairs to another's.
  const patientCodes = [row.previous('patientCode') ?? row.patientCode, row.patientCode]
  row.version += 1
  await row.save({ transaction })
  await derivePairs(patientCodes, { sequelize: row.sequelize, transaction })
  const changes = { ...changesBetween(before, snapshotOf(row)), ...more }
  await audit({ actorId: actor.id, action, entityType: 'exam', entityId: row.id, changes }, { transaction })
  return row
}

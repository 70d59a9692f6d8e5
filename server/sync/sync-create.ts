import type { Transaction } from 'sequelize'
import { estimateContext, type EstimateContext } from '../settings/settings-estimate.ts'
import { ExamInputSchema, type ExamInput } from '#shared/schemas/exam'
import type { SyncChange, SyncResult } from '#shared/schemas/sync'
import type { User } from '#shared/schemas/user'
import { auditAll } from '../audit.ts'
import { changesBetween, snapshotOf } from '../exams/exam-changes.ts'
import { columnsOf, isRetryOf, presentOwn } from '../exams/exam-record.ts'
import { authorFieldErrors, isAuthor } from '../exams/exam-rules.ts'
import { inTransaction } from '../exams/exam-writes.ts'
import { savedEstimate } from '../exams/saved-estimate.ts'
import { ExamModel } from '../models/index.ts'
import { derivePairs } from '../agreement/pair-derivation.ts'
import { roundFieldErrors } from '../rounds/round-membership.ts'
import { fieldsOf } from '../errors.ts'
import { applied, conflictWith, duplicate, invalid, rejected } from './sync-results.ts'

/** The answer for one new exam, or its validated input when it is to be stored. */
async function decide(author: User, change: SyncChange, row: ExamModel | undefined, transaction: Transaction): Promise<SyncResult | ExamInput> {
  const id = change.exam.id
  const parsed = ExamInputSchema.safeParse(change.exam)
  if (!parsed.success) return rejected(id, invalid(fieldsOf(parsed.error)))
  if (row && !isAuthor(row, author)) return rejected(id, { code: 'id-taken', message: 'Another exam already has this id' })
  if (row) return isRetryOf(row, author, parsed.data) ? duplicate(id, row.version) : conflictWith(await presentOwn(row))
  // A calibration-round entry must name an open round of the author's, with one of its codes (server/rounds).
  const roundFields = parsed.data.roundId ? await roundFieldErrors(author, parsed.data, null, transaction) : {}
  const fields = { ...authorFieldErrors(author, parsed.data, null), ...roundFields }
  return Object.keys(fields).length ? rejected(id, invalid(fields)) : parsed.data
}

/** Stores new drafts in one statement, with one audit event each, as createExam would. */
async function insertAll(author: User, inputs: ExamInput[], context: EstimateContext, transaction: Transaction): Promise<ExamModel[]> {
  if (!inputs.length) return []
  const values = inputs.map((input) => ({
    ...columnsOf(input, savedEstimate(input, context)),
    id: input.id,
    examinerId: author.id,
    status: 'draft',
    version: 1,
    submittedAt: null,
  }))
  const rows = await ExamModel.bulkCreate(values, { transaction })
  await derivePairs(rows.map((row) => row.patientCode), { sequelize: ExamModel.sequelize!, transaction })
  const events = rows.map((row) => ({
    actorId: author.id,
    action: 'exam-create',
    entityType: 'exam',
    entityId: row.id,
    changes: changesBetween(null, snapshotOf(row)),
  }))
  await auditAll(events, { transaction })
  return rows
}

/**
 * New exams of one push, in one transaction: a replay of content already stored is a duplicate (no second row, no
 * second audit event), other content under a known id a conflict. Answers keyed by exam id.
 */
export async function applyCreates(author: User, changes: SyncChange[]): Promise<Map<string, SyncResult>> {
  if (!changes.length) return new Map()
  const context = await estimateContext()
  return inTransaction(async (transaction) => {
    const rows = await ExamModel.findAll({ where: { id: changes.map((c) => c.exam.id) }, transaction })
    const existing = new Map(rows.map((row) => [row.id, row]))
    const results = new Map<string, SyncResult>()
    const fresh: ExamInput[] = []
    for (const change of changes) {
      const outcome = await decide(author, change, existing.get(change.exam.id), transaction)
      if ('result' in outcome) results.set(change.exam.id, outcome)
      else fresh.push(outcome)
    }
    for (const row of await insertAll(author, fresh, context, transaction)) results.set(row.id, applied(row.id, row.version))
    return results
  })
}

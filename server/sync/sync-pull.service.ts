import { Op, type WhereOptions } from 'sequelize'
import type { SyncPullQuery, SyncPullResponse, SyncRemoved } from '#shared/schemas/sync'
import { readable, scopeOf, type ExamScope } from '../exams/exam-access.ts'
import type { Viewer } from '../exams/exam-queries.ts'
import { presentPage } from '../exams/exam-page.ts'
import type { ExamRead } from '../exams/exam-answers.ts'
import { ExamModel } from '../models/index.ts'

type Where = WhereOptions<ExamModel>

/** Exams that left their author once and are drafts again (amended): readers other than the author lost them. */
const REOPENED: Where = { status: 'draft', submittedAt: { [Op.ne]: null } }

const isReopened = (row: ExamModel) => row.status === 'draft' && row.submittedAt !== null

/**
 * Whether the viewer read this row before it was reopened, by the exams API's own rules (`exam-access.ts`): the row
 * as it was when shared. A reader of another team never learns even the id.
 */
function formerReader(scope: ExamScope, row: ExamModel): boolean {
  if (scope.program) return true
  return scope.showsCode(ExamModel.build({ ...row.get({ plain: true }), status: 'submitted' }))
}

/** The ids of the rows the viewer may read now; only a reopened row can have come into the page without being readable. */
async function readableIds(rows: ExamModel[], where: Where): Promise<Set<string>> {
  const doubtful = rows.filter(isReopened).map((row) => row.id)
  const ids = new Set(rows.filter((row) => !isReopened(row)).map((row) => row.id))
  if (!doubtful.length) return ids
  const found = await ExamModel.findAll({ attributes: ['id'], where: { [Op.and]: [{ id: { [Op.in]: doubtful } }, where] } })
  for (const row of found) ids.add(row.id)
  return ids
}

/** Up to `limit + 1` changes after the cursor, in cursor order. */
function changesIn(query: SyncPullQuery, where: Where): Promise<ExamModel[]> {
  return ExamModel.findAll({
    where: { [Op.and]: [{ syncSeq: { [Op.gt]: query.cursor } }, where] },
    order: [['syncSeq', 'ASC']],
    limit: query.limit + 1,
  })
}

/**
 * The readable changes and the reopened ones, each read in cursor order along its own index and merged: as one OR
 * query SQLite would gather every match of both before sorting, all of a heavy examiner's exams after the cursor.
 * A device at cursor 0 holds nothing pulled, so it has nothing to drop.
 */
async function changedAfter(query: SyncPullQuery, where: Where): Promise<ExamModel[]> {
  const [readableRows, reopened] = await Promise.all([changesIn(query, where), query.cursor > 0 ? changesIn(query, REOPENED) : []])
  const byId = new Map([...readableRows, ...reopened].map((row) => [row.id, row]))
  return [...byId.values()].sort((a, b) => a.syncSeq! - b.syncSeq!).slice(0, query.limit + 1)
}

/**
 * The exams the viewer may read whose last change came after the cursor, in the order the changes were committed,
 * with patient codes as the exams API shows them; and, on the same cursor, the ids of exams the viewer read before
 * and may no longer read, so the device drops its copy. The cursor is the server's change counter, never a client
 * clock; each change is in exactly one page, in one of the two lists.
 */
export async function pullChanges(viewer: Viewer, query: SyncPullQuery, read?: Omit<ExamRead, 'keyOf'>): Promise<SyncPullResponse> {
  const scope = read?.scope ?? (await scopeOf(viewer.user))
  const where = readable(scope)
  if (!where) return { exams: [], removed: [], cursor: query.cursor, more: false }
  const rows = await changedAfter(query, where)
  const page = rows.slice(0, query.limit)
  const visible = await readableIds(page, where)
  const removed: SyncRemoved[] = page
    .filter((row) => !visible.has(row.id) && formerReader(scope, row))
    .map((row) => ({ id: row.id, syncSeq: row.syncSeq! }))
  const shown = page.filter((row) => visible.has(row.id))
  const codeOf = (row: ExamModel) => (scope.showsCode(row) ? row.patientCode : viewer.mask(row.patientCode))
  const exams = await presentPage(shown, codeOf, read?.cache)
  return { exams, removed, cursor: page.at(-1)?.syncSeq ?? query.cursor, more: rows.length > query.limit }
}

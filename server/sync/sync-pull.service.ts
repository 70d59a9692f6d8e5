import { Op } from 'sequelize'
import type { SyncPullQuery, SyncPullResponse } from '#shared/schemas/sync'
import { readable, scopeOf } from '../exams/exam-access.ts'
import type { Viewer } from '../exams/exam-queries.ts'
import { present } from '../exams/exam-record.ts'
import { ExamModel } from '../models/index.ts'

/**
 * The exams the viewer may read whose last change came after the cursor, in the order the changes were committed,
 * with patient codes as the exams API shows them. The cursor is the server's change counter, never a client clock.
 */
export async function pullChanges(viewer: Viewer, query: SyncPullQuery): Promise<SyncPullResponse> {
  const scope = await scopeOf(viewer.user)
  const where = readable(scope)
  if (!where) return { exams: [], cursor: query.cursor, more: false }
  const rows = await ExamModel.findAll({
    where: { [Op.and]: [{ syncSeq: { [Op.gt]: query.cursor } }, where] },
    order: [['syncSeq', 'ASC']],
    limit: query.limit + 1,
  })
  const page = rows.slice(0, query.limit)
  const exams = await present(page, (row) => (scope.showsCode(row) ? row.patientCode : viewer.mask(row.patientCode)))
  return { exams, cursor: page.at(-1)?.syncSeq ?? query.cursor, more: rows.length > query.limit }
}

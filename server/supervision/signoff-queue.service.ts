import { literal, Op, type WhereOptions } from 'sequelize'
import type { SignoffQueue, SignoffQueueQuery } from '#shared/schemas/signoff-queue'
import type { User } from '#shared/schemas/user'
import { present } from '../exams/exam-record.ts'
import { ExamModel } from '../models/index.ts'
import { blinded, blindingClause } from '../rounds/round-blinding.ts'
import { teamIdsOf } from '../users/team-members.ts'
import { READING_EXAM_IDS } from './review-access.ts'

/** What the attending may countersign: submitted exams filed to their teams, by anyone but themselves. */
async function waitingFor(attending: User): Promise<WhereOptions<ExamModel>> {
  const waiting = {
    status: 'submitted',
    teamId: { [Op.in]: teamIdsOf(attending) },
    examinerId: { [Op.ne]: attending.id },
    id: { [Op.notIn]: literal(READING_EXAM_IDS) },
  }
  // Entries of an open calibration round join the queue once the round closes (blinding, server/rounds).
  return blinded(waiting, await blindingClause(attending.id))!
}

/** The attending's sign-off queue, the longest-waiting first. */
export async function signoffQueue(attending: User, query: SignoffQueueQuery): Promise<SignoffQueue> {
  const { rows, count } = await ExamModel.findAndCountAll({
    where: await waitingFor(attending),
    order: [['submittedAt', 'ASC'], ['id', 'ASC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  })
  // Team attendings see the real codes of their teams' submitted exams (exam-access.ts).
  const exams = await present(rows, (r) => r.patientCode)
  const now = Date.now()
  const items = exams.map((exam, i) => ({
    exam,
    waitingSeconds: Math.max(0, Math.floor((now - (rows[i]!.submittedAt?.getTime() ?? now)) / 1000)),
  }))
  return { items, total: count, page: query.page, pageSize: query.pageSize }
}

export async function signoffCount(attending: User): Promise<{ count: number }> {
  return { count: await ExamModel.count({ where: await waitingFor(attending) }) }
}

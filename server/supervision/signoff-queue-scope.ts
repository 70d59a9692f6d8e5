import { literal, Op, type WhereOptions } from 'sequelize'
import type { SignoffQueueQuery } from '#shared/schemas/signoff-queue'
import type { User } from '#shared/schemas/user'
import { containsText } from '../db/text-search.ts'
import { ExamModel, UserModel } from '../models/index.ts'
import { blinded, blindingClause } from '../rounds/round-blinding.ts'
import { teamIdsOf } from '../users/team-members.ts'
import { READING_EXAM_IDS } from './review-access.ts'

type Where = WhereOptions<ExamModel>

/** What the attending may countersign: submitted exams filed to their teams, by anyone but themselves. */
export async function waitingFor(attending: User): Promise<Where> {
  const waiting = {
    status: 'submitted',
    teamId: { [Op.in]: teamIdsOf(attending) },
    examinerId: { [Op.ne]: attending.id },
    id: { [Op.notIn]: literal(READING_EXAM_IDS) },
  }
  // Entries of an open calibration round join the queue once the round closes (blinding, server/rounds).
  return blinded(waiting, await blindingClause(attending.id))!
}

/** The patient code, or the examiner's name, contains the text without case (`%` and `_` match only themselves). */
async function searchClause(text: string): Promise<Where> {
  const sequelize = ExamModel.sequelize!
  const examiners = await UserModel.findAll({ attributes: ['id'], where: containsText(sequelize, 'displayName', text), raw: true })
  return { [Op.or]: [containsText(sequelize, 'patientCode', text), { examinerId: { [Op.in]: examiners.map((u) => u.id) } }] }
}

/** The queue narrowed by the search and the resident asked for. */
export async function filteredQueue(attending: User, query: Pick<SignoffQueueQuery, 'q' | 'residentId'>): Promise<Where> {
  const parts: Where[] = [await waitingFor(attending)]
  if (query.residentId) parts.push({ examinerId: query.residentId })
  if (query.q) parts.push(await searchClause(query.q))
  return parts.length === 1 ? parts[0]! : { [Op.and]: parts }
}

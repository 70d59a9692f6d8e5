import { Op, type WhereOptions } from 'sequelize'
import type { User } from '#shared/schemas/user'
import { AppError } from '../errors.ts'
import { isAuthor } from '../exams/exam-rules.ts'
import { ExamModel, RoundExaminerModel, RoundModel } from '../models/index.ts'

type Where = WhereOptions<ExamModel>

/**
 * Blinding of calibration rounds: while a round is open, its entries are readable by their author only — not by
 * the other examiners, not by the author's attendings, not by educators (the round's educator follows progress on
 * the round itself, without values). The clause is added to every exam scope (lists, single reads, sync pull).
 * Null when no round is open, so the usual queries stay as they are. `openRounds`: the open rounds' ids when the
 * request already read them (users/auth-state.ts).
 */
export async function blindingClause(userId: string, openRounds?: string[]): Promise<Where | null> {
  const open = openRounds ?? (await RoundModel.findAll({ attributes: ['id'], where: { status: 'open' }, raw: true })).map((r) => r.id)
  if (!open.length) return null
  return { [Op.or]: [{ roundId: null }, { roundId: { [Op.notIn]: open } }, { examinerId: userId }] }
}

/**
 * The closed rounds the user examined in: once a round closes, its examiners read one another's submitted entries
 * (with the patient codes, which they examined themselves) to compare readings.
 */
export async function closedRoundsExamined(userId: string): Promise<Set<string>> {
  const memberships = await RoundExaminerModel.findAll({ attributes: ['roundId'], where: { examinerId: userId }, raw: true })
  if (!memberships.length) return new Set()
  const closed = await RoundModel.findAll({
    attributes: ['id'],
    where: { id: { [Op.in]: memberships.map((m) => m.roundId) }, status: 'closed' },
    raw: true,
  })
  return new Set(closed.map((r) => r.id))
}

/** A scope's clause narrowed by the blinding clause. */
export function blinded(where: Where | null, clause: Where | null): Where | null {
  if (!where || !clause) return where
  return { [Op.and]: [where, clause] }
}

export const roundBlinded = () =>
  new AppError('round-blinded', 403, 'This is another examiner’s entry in an open calibration round; it can be read once the round closes')

/**
 * Why a row the reader cannot read is hidden, when the reason is a round's blinding: 403 for a member of the round
 * (an examiner or its educator) or anyone who could read the exam without the blinding; null (so 404) otherwise.
 */
export async function blindedEntryError(user: User, id: string, unblinded: Where | null): Promise<AppError | null> {
  const row = await ExamModel.findByPk(id, { attributes: ['id', 'roundId', 'examinerId'] })
  if (!row?.roundId || isAuthor(row, user)) return null
  const round = await RoundModel.findByPk(row.roundId)
  if (round?.status !== 'open') return null
  if (round.createdBy === user.id) return roundBlinded()
  if ((await RoundExaminerModel.count({ where: { roundId: round.id, examinerId: user.id } })) > 0) return roundBlinded()
  const wouldRead = !!unblinded && (await ExamModel.count({ where: { [Op.and]: [{ id }, unblinded] } })) > 0
  return wouldRead ? roundBlinded() : null
}

import { Op, type WhereOptions } from 'sequelize'
import type { User } from '#shared/schemas/user'
import { maskCodes } from '../exams/code-masking.ts'
import { readable, scopeOf } from '../exams/exam-access.ts'
import { ExamModel } from '../models/index.ts'

/** Who reads a round, with the keyed pseudonym function of `exams/exam-access.ts` (`patientCodeMask`). */
export interface RoundViewer {
  user: User
  mask: (patientCode: string) => string
}

/**
 * How a round's patient codes reach one viewer (README, Roles). The round's examiners recorded the codes at the
 * bedside and see them as they are; anyone else (its educator) sees keyed pseudonyms everywhere a code appears — in
 * fields and in free text — as educators do for exams. Masking is deterministic, so a real code must never travel
 * next to anything that also shows its pseudonym.
 */
export interface CodePresenter {
  masked: boolean
  /** A code as the viewer sees it. */
  code(patientCode: string): string
  /** Free text (e.g. the round's name) with any of the round's codes replaced as `code` would. */
  text(value: string): string
}

export function codePresenter(viewer: RoundViewer, roundCodes: readonly string[], isExaminer: boolean): CodePresenter {
  if (isExaminer) return { masked: false, code: (c) => c, text: (t) => t }
  return { masked: true, code: (c) => viewer.mask(c), text: (t) => maskCodes(t, roundCodes, viewer.mask) }
}

/**
 * Of the given exams, those whose id the viewer may be shown: the exams they may read (`GET /api/exams/:id`, including
 * a closed round's entries for its examiners) and whose code that read shows as the round shows it — real to an
 * examiner, masked to a masked viewer. An exam read with the real code next to a round cell with the pseudonym (or
 * the reverse) would pair the two.
 */
export async function examIdsShown(viewer: RoundViewer, examIds: readonly string[], masked: boolean): Promise<Set<string>> {
  if (!examIds.length) return new Set()
  const scope = await scopeOf(viewer.user)
  const where: WhereOptions<ExamModel> | null = scope.roundPeers
    ? { [Op.or]: [readable(scope) ?? scope.roundPeers, scope.roundPeers] }
    : readable(scope)
  if (!where) return new Set()
  const rows = await ExamModel.findAll({ where: { [Op.and]: [{ id: { [Op.in]: [...new Set(examIds)] } }, where] } })
  return new Set(rows.filter((row) => scope.showsCode(row) !== masked).map((row) => row.id))
}

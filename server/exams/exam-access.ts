import { createHmac } from 'node:crypto'
import { Op, type WhereOptions } from 'sequelize'
import type { User } from '#shared/schemas/user'
import type { ExamModel } from '../models/index.ts'
import { membersOf, teamIdsOf } from '../users/team-members.ts'
import { isAuthor } from './exam-rules.ts'
import { blinded, blindingClause, closedRoundsExamined } from '../rounds/round-blinding.ts'
import { whereKey } from './where-key.ts'
import type { ReadFacts } from '../users/auth-state.ts'

type Where = WhereOptions<ExamModel>

/** Who sees which exams (README, Roles), as SQL for lists and as a predicate for unmasking single rows. */
export interface ExamScope {
  /** Readable with the real patient code: one's own exams; for attendings, their teams' non-drafts. Null: none. */
  clinical: Where | null
  /** Readable only with the code masked: every non-draft of the program, for educators. Null: none. */
  program: Where | null
  showsCode(row: ExamModel): boolean
  /** What the reader could read if no calibration round were blinded: tells a blinded entry (403) from a stranger's (404). */
  unblinded?: Where | null
  /** Entries of closed rounds the reader examined in: readable one by one (not listed, not pulled), with their codes. */
  roundPeers?: Where | null
  /**
   * A patient's course as the ward follows it (the patient timeline): the clinical scope and, for residents, the
   * non-drafts filed to their own teams, since the team looks after the patient together. Null: none.
   */
  care?: Where | null
  /** Everything the scope is made of (reader, roles, teams, colleagues, rounds): equal keys, equal scopes. */
  key: string
}

const notDraft: Where = { status: { [Op.ne]: 'draft' } }

/** `facts`: what the request's account statement read (users/auth-state.ts); without them, they are read here. */
export async function scopeOf(user: User, facts?: ReadFacts): Promise<ExamScope> {
  const roles = new Set(user.roles)
  const recordsExams = roles.has('resident') || roles.has('attending')
  const teamIds = new Set(teamIdsOf(user))
  const colleagues = !roles.has('attending') ? new Set<string>() : (facts?.teammates ?? (await membersOf(teamIds)))
  const clinical: Where[] = []
  if (recordsExams) clinical.push({ examinerId: user.id })
  // Attendings read their teams' residents: exams filed to their teams, and those their teams' members filed elsewhere.
  if (roles.has('attending'))
    clinical.push({ ...notDraft, [Op.or]: [{ teamId: { [Op.in]: [...teamIds] } }, { examinerId: { [Op.in]: [...colleagues] } }] })
  // Examiners of a closed calibration round may open each other's entries of it, one by one (server/rounds/round-blinding.ts).
  const closedRounds = facts?.closedRoundsExamined ?? (await closedRoundsExamined(user.id))
  const clinicalWhere: Where | null = clinical.length ? { [Op.or]: clinical } : null
  const programWhere: Where | null = roles.has('educator') ? notDraft : null
  // Entries of open calibration rounds are their authors' alone until the round closes (server/rounds/round-blinding.ts).
  const blind = await blindingClause(user.id, facts?.openRounds)
  const teamCare: Where | null = roles.has('resident') && teamIds.size ? { ...notDraft, teamId: { [Op.in]: [...teamIds] } } : null
  return {
    care: blinded(teamCare && clinicalWhere ? { [Op.or]: [clinicalWhere, teamCare] } : clinicalWhere, blind),
    clinical: blinded(clinicalWhere, blind),
    program: blinded(programWhere, blind),
    unblinded: readable({ clinical: clinicalWhere, program: programWhere, showsCode: () => false, key: '' }),
    roundPeers: closedRounds.size ? { ...notDraft, roundId: { [Op.in]: [...closedRounds] } } : null,
    showsCode: (row) =>
      (recordsExams && isAuthor(row, user)) ||
      (roles.has('attending') && row.status !== 'draft' && (teamIds.has(row.teamId) || colleagues.has(row.examinerId))) ||
      (row.status !== 'draft' && !!row.roundId && closedRounds.has(row.roundId)),
    key: whereKey([user.id, [...roles].sort(), [...teamIds].sort(), [...colleagues].sort(), [...closedRounds].sort(), blind]),
  }
}

/** The rows a scope may read at all; null when it may read none (admins). */
export function readable(scope: ExamScope): Where | null {
  const parts = [scope.clinical, scope.program].filter((w): w is Where => w !== null)
  return parts.length ? { [Op.or]: parts } : null
}

/**
 * A stable pseudonym for a patient code, keyed by a sub-key of the server secret: an educator can see that two
 * exams concern one patient without learning who. It changes if the secret is rotated.
 */
export function patientCodeMask(secret: string): (code: string) => string {
  const key = createHmac('sha256', secret).update('plumbline/patient-code-mask').digest()
  return (code) => `P-${createHmac('sha256', key).update(code).digest('hex').slice(0, 8)}`
}

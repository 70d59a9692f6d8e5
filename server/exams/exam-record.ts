import { Op } from 'sequelize'
import { ExamInputSchema, ExamSchema, type Exam, type ExamInput } from '#shared/schemas/exam'
import type { User } from '#shared/schemas/user'
import { ExamModel, TeamModel, UserModel } from '../models/index.ts'
import { isAuthor } from './exam-rules.ts'
import { signaturesOf } from '../supervision/signatures.ts'
import { sortedJson, storedInput } from './exam-columns.ts'

export { columnsOf, storedInput } from './exam-columns.ts'

/**
 * The free text (notes, the "other" reason, a return comment) for a reader who sees the patient code: as written.
 * A reader who sees the code masked (an educator) gets none of it: free text can name any patient, not only this one.
 */
function freeTextFor(row: ExamModel, code: string) {
  if (code !== row.patientCode) return { notes: '', notAssessableText: null, returnComment: null }
  return { notes: row.notes ?? '', returnComment: row.returnComment ?? null }
}

/** Rows as the API's exam shape, with names and signatures joined and the patient code as the reader may see it. */
export async function present(rows: ExamModel[], codeOf: (row: ExamModel) => string): Promise<Exam[]> {
  if (!rows.length) return []
  const [users, teams, signatures] = await Promise.all([
    UserModel.findAll({ where: { id: { [Op.in]: [...new Set(rows.map((r) => r.examinerId))] } } }),
    TeamModel.findAll({ where: { id: { [Op.in]: [...new Set(rows.map((r) => r.teamId))] } } }),
    signaturesOf(rows),
  ])
  const userNames = new Map(users.map((u) => [u.id, u.displayName]))
  const teamNames = new Map(teams.map((t) => [t.id, t.name]))
  return rows.map((row) =>
    ExamSchema.parse({
      ...storedInput(row),
      patientCode: codeOf(row),
      ...freeTextFor(row, codeOf(row)),
      examinerId: row.examinerId,
      examinerName: userNames.get(row.examinerId) ?? '',
      teamName: teamNames.get(row.teamId) ?? '',
      status: row.status,
      version: row.version,
      estimate: JSON.parse(row.estimate),
      createdAt: row.createdAt.toISOString(),
      updatedAt: row.updatedAt.toISOString(),
      submittedAt: row.submittedAt?.toISOString() ?? null,
      signatures: signatures.get(row.id) ?? [],
    }),
  )
}

/** The author's own view of one row. */
export async function presentOwn(row: ExamModel): Promise<Exam> {
  const [exam] = await present([row], (r) => r.patientCode)
  return exam!
}

/** The record's content: the band the examiner reviewed travels with a save but is not part of the record. */
function canonical({ reviewed: _reviewed, ...input }: ExamInput): string {
  return sortedJson({
    ...input,
    examinedAt: new Date(input.examinedAt).toISOString(),
    heightCm: input.heightCm ?? null,
    alongNeckCm: input.alongNeckCm ?? null,
    roundId: input.roundId ?? null,
    notAssessableReason: input.notAssessableReason ?? null,
    notAssessableText: input.notAssessableText ?? null,
  })
}

/** The author's stored row already holds exactly this content: a retry whose answer was lost, not a new write. */
export const isRetryOf = (row: ExamModel, author: User, input: ExamInput): boolean => isAuthor(row, author) && sameRecord(row, input)

/** Whether a stored row holds exactly this record, however the client wrote the time or ordered the keys. */
export function sameRecord(row: ExamModel, input: ExamInput): boolean {
  const stored = ExamInputSchema.safeParse(storedInput(row))
  return stored.success && canonical(stored.data) === canonical(input)
}

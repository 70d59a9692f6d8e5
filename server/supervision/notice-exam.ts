import type { Transaction } from 'sequelize'
import type { Exam } from '#shared/schemas/exam'
import type { Signature } from '#shared/schemas/signature'
import { ExamModel, TeamModel, UserModel, type SignatureModel } from '../models/index.ts'
import { manifestation } from './signatures.ts'

/** What a workflow e-mail says of an exam. */
export type NoticeExam = Pick<Exam, 'id' | 'teamId' | 'teamName' | 'patientCode' | 'examinerId' | 'examinerName'> & {
  examinedAt: Date | string
  returnComment?: string | null
}

/**
 * The exam as an e-mail names it, read inside the action's transaction when there is one: the rows it wrote are not
 * committed yet, so only that transaction sees them.
 */
export async function noticeExamOf(row: ExamModel, transaction?: Transaction): Promise<NoticeExam> {
  const [examiner, team] = await Promise.all([
    UserModel.findByPk(row.examinerId, { attributes: ['displayName'], transaction }),
    TeamModel.findByPk(row.teamId, { attributes: ['name'], transaction }),
  ])
  const { id, teamId, patientCode, examinerId, examinedAt, returnComment } = row
  return {
    id,
    teamId,
    patientCode,
    examinerId,
    examinedAt,
    returnComment,
    examinerName: examiner?.displayName ?? '',
    teamName: team?.name ?? '',
  }
}

/** The signature as its manifestation shows it (reading and feedback included), read inside the signing transaction. */
export async function signatureNotice(signature: SignatureModel, row: ExamModel, transaction: Transaction): Promise<Signature> {
  const reading = signature.readingExamId ? await ExamModel.findByPk(signature.readingExamId, { transaction }) : null
  return manifestation(signature, row, undefined, reading ?? undefined)
}

import type { Transaction } from 'sequelize'
import type { User } from '#shared/schemas/user'
import { RoundExaminerModel, RoundModel, RoundPatientCodeModel } from '../models/index.ts'

interface RoundFields {
  roundId?: string | null
  patientCode: string
}

/**
 * The rules an exam's `roundId` follows beyond the schema, as field errors (empty when it may be stored): it may name
 * only an open round the author examines in, with one of that round's patient codes. Checked on a new exam, and on a
 * change that moves the exam into, out of or within a round (another code); an entry of a closed round keeps its
 * round and code, so the closed results do not shift under the educator. Other edits of an entry stay possible.
 */
export async function roundFieldErrors(
  author: User,
  input: RoundFields,
  before: { roundId: string | null; patientCode: string } | null,
  transaction?: Transaction,
): Promise<Record<string, string>> {
  const roundId = input.roundId ?? null
  const previous = before?.roundId ?? null
  const moved = roundId !== previous || (roundId !== null && input.patientCode !== before?.patientCode)
  if (!moved) return {}
  if (previous) {
    const left = await RoundModel.findByPk(previous, { transaction })
    if (left?.status === 'closed') {
      const field = roundId !== previous ? 'roundId' : 'patientCode'
      return { [field]: 'The calibration round is closed: its entries keep their round and patient code' }
    }
  }
  if (!roundId) return {}
  const round = await RoundModel.findByPk(roundId, { transaction })
  if (!round) return { roundId: 'No such calibration round' }
  if (round.status !== 'open') return { roundId: 'This calibration round is closed' }
  const member = await RoundExaminerModel.count({ where: { roundId, examinerId: author.id }, transaction })
  if (!member) return { roundId: 'You are not one of this round’s examiners' }
  const code = await RoundPatientCodeModel.count({ where: { roundId, patientCode: input.patientCode }, transaction })
  if (!code) return { patientCode: 'This patient code is not in the round: choose one of its codes' }
  return {}
}

import { Op } from 'sequelize'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import type { PatientTimeline } from '#shared/schemas/timeline'
import type { User } from '#shared/schemas/user'
import { AppError } from '../errors.ts'
import { scopeOf } from '../exams/exam-access.ts'
import { present } from '../exams/exam-record.ts'
import { ExamModel } from '../models/index.ts'
import { referencesOf } from '../references/reference-records.ts'

/**
 * Every exam of one patient code in the reader's care scope (exam-access.ts), oldest first, with the references beside
 * them. Educators and admins get 403: they never see real patient codes. A code with nothing readable is 404.
 */
export async function patientTimeline(user: User, patientCode: string): Promise<PatientTimeline> {
  const scope = await scopeOf(user)
  if (!scope.care) throw new AppError('forbidden', 403, 'Patient timelines are for the clinicians caring for the patient')
  const rows = await ExamModel.findAll({
    where: { [Op.and]: [{ patientCode }, scope.care] },
    order: [
      ['examinedAt', 'ASC'],
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
  })
  if (!rows.length) throw new AppError('patient-not-found', 404, 'No exams of this patient code that you may read')
  // The reader asked by the code itself and is caring for the patient: the code is shown as it is.
  const [exams, references] = await Promise.all([present(rows, (row) => row.patientCode), referencesOf(rows)])
  return { patientCode, exams, references, caution: CAUTION_TEXT }
}

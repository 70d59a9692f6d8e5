import { Op } from 'sequelize'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { withoutFloatNoise } from '#shared/domain/units'
import { FeedbackCodeSchema, type FeedbackCode } from '#shared/schemas/signature'
import type { FeedbackReceived, MyAgreement } from '#shared/schemas/learning'
import { AgreementPairModel, ExamModel, SignatureModel } from '../models/index.ts'
import { readingDifference } from '../supervision/signature-teaching.ts'
import { differenceFigures, learningCurve } from './learning-curve.ts'
import { residentFor, type LearningViewer } from './learning-access.ts'

/** The resident's point pairs (both column tops seen), oldest first: the resident's estimate − the partner's, cmH₂O. */
async function differencesOf(residentId: string): Promise<number[]> {
  const rows = await AgreementPairModel.findAll({
    where: {
      [Op.or]: [{ earlierExaminerId: residentId }, { laterExaminerId: residentId }],
      earlierColumnTop: 'seen',
      laterColumnTop: 'seen',
    },
    order: [
      ['pairedAt', 'ASC'],
      ['earlierExamId', 'ASC'],
    ],
    raw: true,
  })
  return rows.map((p) =>
    withoutFloatNoise(p.earlierExaminerId === residentId ? p.earlierCvpCmH2O - p.laterCvpCmH2O : p.laterCvpCmH2O - p.earlierCvpCmH2O),
  )
}

/** Feedback and readings attendings gave with countersignatures of the resident's exams, newest first. */
async function feedbackOf(residentId: string, codeOf: (code: string) => string): Promise<FeedbackReceived[]> {
  const exams = await ExamModel.findAll({ where: { examinerId: residentId, status: { [Op.ne]: 'draft' } } })
  const byId = new Map(exams.map((e) => [e.id, e]))
  const signatures = await SignatureModel.findAll({
    where: {
      examId: { [Op.in]: [...byId.keys()] },
      [Op.or]: [{ feedback: { [Op.ne]: null } }, { feedbackText: { [Op.ne]: null } }, { readingExamId: { [Op.ne]: null } }],
    },
    order: [
      ['signedAt', 'DESC'],
      ['id', 'ASC'],
    ],
  })
  const readingIds = signatures.flatMap((s) => (s.readingExamId ? [s.readingExamId] : []))
  const readings = new Map((await ExamModel.findAll({ where: { id: { [Op.in]: readingIds } } })).map((r) => [r.id, r]))
  return signatures.map((s) => {
    const exam = byId.get(s.examId)!
    const reading = s.readingExamId ? readings.get(s.readingExamId) : undefined
    const codes: FeedbackCode[] = s.feedback ? FeedbackCodeSchema.array().parse(JSON.parse(s.feedback)) : []
    return {
      examId: exam.id,
      patientCode: codeOf(exam.patientCode),
      signerName: s.signerName,
      signedAt: s.signedAt.toISOString(),
      codes,
      text: s.feedbackText,
      differenceCmH2O: reading ? readingDifference(exam, reading) : null,
    }
  })
}

/** A resident's agreement with their partners, the learning curve and the feedback received. */
export async function myAgreement(viewer: LearningViewer, residentId: string | undefined): Promise<MyAgreement> {
  const { resident, codeOf } = await residentFor(viewer, residentId)
  const [differences, feedback] = await Promise.all([differencesOf(resident.id), feedbackOf(resident.id, codeOf)])
  return {
    residentId: resident.id,
    name: resident.displayName,
    ...differenceFigures(differences),
    curve: learningCurve(differences),
    feedback,
    caution: CAUTION_TEXT,
  }
}

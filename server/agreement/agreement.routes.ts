import { Router, type Response } from 'express'
import { AgreementPairsQuerySchema, AgreementQuerySchema } from '#shared/schemas/agreement'
import { patientCodeMask } from '../exams/exam-access.ts'
import { currentUser, requireRole } from '../middleware/auth.ts'
import { agreementSummary, agreementTrend, listAgreementPairs, type AgreementViewer } from './agreement.service.ts'

/** `secret` keys the same patient-code pseudonyms as the exam lists, so a pair can be matched to its exams. */
export function agreementRouter({ secret }: { secret: string }): Router {
  const router = Router()
  const mask = patientCodeMask(secret)
  const viewer = (res: Response): AgreementViewer => ({ user: currentUser(res), mask })
  const readers = requireRole('resident', 'attending', 'educator')

  router.get('/summary', readers, async (req, res) =>
    res.json(await agreementSummary(currentUser(res), AgreementQuerySchema.parse(req.query))),
  )
  router.get('/trend', readers, async (req, res) =>
    res.json(await agreementTrend(currentUser(res), AgreementQuerySchema.parse(req.query))),
  )
  router.get('/pairs', readers, async (req, res) =>
    res.json(await listAgreementPairs(viewer(res), AgreementPairsQuerySchema.parse(req.query))),
  )
  return router
}

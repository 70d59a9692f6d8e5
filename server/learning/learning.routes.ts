import { Router } from 'express'
import { MyAgreementQuerySchema } from '#shared/schemas/learning'
import { patientCodeMask } from '../exams/exam-access.ts'
import { currentUser, requireRole } from '../middleware/auth.ts'
import { myAgreement } from './learning.service.ts'

/** `GET /api/agreement/mine`. `secret` keys the patient-code pseudonyms educators see. Mount it behind `requireAuth`. */
export function learningRouter({ secret }: { secret: string }): Router {
  const router = Router()
  const mask = patientCodeMask(secret)
  router.get('/', requireRole('resident', 'attending', 'educator'), async (req, res) =>
    res.json(await myAgreement({ user: currentUser(res), mask }, MyAgreementQuerySchema.parse(req.query).residentId)),
  )
  return router
}

import { Router } from 'express'
import { AuditQuerySchema } from '#shared/schemas/audit'
import { patientCodeMask } from '../exams/exam-access.ts'
import { requireRole } from '../middleware/auth.ts'
import { browseAudit } from './audit-trail.service.ts'

/** `GET /audit` → the trail, filtered and paged, for admins. Mount it behind `requireAuth`. */
export function auditTrailRouter({ secret }: { secret: string }): Router {
  const router = Router()
  const mask = patientCodeMask(secret)
  router.get('/audit', requireRole('admin'), async (req, res) => res.json(await browseAudit(AuditQuerySchema.parse(req.query), mask)))
  return router
}

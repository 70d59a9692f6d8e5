import { Router } from 'express'
import { AuditQuerySchema } from '#shared/schemas/audit'
import { patientCodeMask } from '../exams/exam-access.ts'
import { requireRole } from '../middleware/auth.ts'
import { browseAudit } from './audit-trail.service.ts'
import { verifyAuditChain } from './chain-verify.ts'

/**
 * `GET /audit` → the trail, filtered and paged, and `GET /audit/verify` → the walk of its hash chain, for admins. Mount
 * it behind `requireAuth`.
 */
export function auditTrailRouter({ secret }: { secret: string }): Router {
  const router = Router()
  const mask = patientCodeMask(secret)
  router.get('/audit', requireRole('admin'), async (req, res) => res.json(await browseAudit(AuditQuerySchema.parse(req.query), mask)))
  router.get('/audit/verify', requireRole('admin'), async (_req, res) => res.json(await verifyAuditChain()))
  return router
}

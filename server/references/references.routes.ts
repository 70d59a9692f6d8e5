import { Router, type Request } from 'express'
import { z } from 'zod'
import { AccuracyQuerySchema, ReferenceInputSchema } from '#shared/schemas/reference'
import { currentUser, requireRole } from '../middleware/auth.ts'
import { accuracySummary } from './accuracy.service.ts'
import { addReference, listReferences } from './references.service.ts'

const IdParamsSchema = z.object({ id: z.string() })
const idOf = (req: Request) => IdParamsSchema.parse(req.params).id

/** `POST|GET /api/exams/:id/references`. Mount it at `/api` behind `requireAuth`. */
export function referencesRouter(): Router {
  const router = Router()
  router.post('/exams/:id/references', requireRole('resident', 'attending'), async (req, res) =>
    res.status(201).json(await addReference(currentUser(res), idOf(req), ReferenceInputSchema.parse(req.body ?? {}))),
  )
  router.get('/exams/:id/references', async (req, res) => res.json(await listReferences(currentUser(res), idOf(req))))
  return router
}

/** `GET /api/agreement/accuracy`: educators, and attendings for their teams. Mount it behind `requireAuth`. */
export function accuracyRouter(): Router {
  const router = Router()
  router.get('/', requireRole('attending', 'educator'), async (req, res) =>
    res.json(await accuracySummary(currentUser(res), AccuracyQuerySchema.parse(req.query))),
  )
  return router
}

import { Router } from 'express'
import { z } from 'zod'
import { PatientCodeSchema } from '#shared/schemas/exam'
import { currentUser } from '../middleware/auth.ts'
import { patientTimeline } from './timeline.service.ts'

const CodeParamsSchema = z.object({ code: PatientCodeSchema })

/** `GET /api/patients/:code/timeline`. Mount it at `/api/patients` behind `requireAuth`. */
export function patientsRouter(): Router {
  const router = Router()
  router.get('/:code/timeline', async (req, res) =>
    res.json(await patientTimeline(currentUser(res), CodeParamsSchema.parse(req.params).code)),
  )
  return router
}

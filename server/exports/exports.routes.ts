import { Router, type Request, type Response } from 'express'
import { z } from 'zod'
import { ExamExportQuerySchema } from '#shared/schemas/export'
import { patientCodeMask } from '../exams/exam-access.ts'
import type { Viewer } from '../exams/exam-queries.ts'
import { currentUser, requireRole } from '../middleware/auth.ts'
import { examFhir, examsCsvExport } from './exports.service.ts'

const IdParamsSchema = z.object({ id: z.string() })

/** `GET /exams/:id/fhir` (FHIR R4) and `GET /exports/exams.csv`. Mount it behind `requireAuth`. */
export function exportsRouter(options: { secret: string }): Router {
  const router = Router()
  const mask = patientCodeMask(options.secret)
  const viewer = (res: Response): Viewer => ({ user: currentUser(res), mask })

  // Anyone who may read the exam; the rest, admins included, get 404 as they do for the exam itself.
  router.get('/exams/:id/fhir', async (req: Request, res) => {
    const bundle = await examFhir(viewer(res), IdParamsSchema.parse(req.params).id)
    res.type('application/fhir+json; charset=utf-8').send(JSON.stringify(bundle))
  })

  router.get('/exports/exams.csv', requireRole('resident', 'attending', 'educator'), async (req, res) => {
    const { csv } = await examsCsvExport(viewer(res), ExamExportQuerySchema.parse(req.query))
    const day = new Date().toISOString().slice(0, 10)
    res.set('Content-Disposition', `attachment; filename="plumbline-exams-${day}.csv"`)
    res.type('text/csv; charset=utf-8').send(csv)
  })
  return router
}

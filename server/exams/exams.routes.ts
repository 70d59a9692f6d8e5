import { Router, type Request, type Response } from 'express'
import { z } from 'zod'
import { estimateContext, estimateWith } from '../settings/settings-estimate.ts'
import { ExamFindingsSchema, ExamInputSchema, ExamListQuerySchema, ExamPatchSchema } from '#shared/schemas/exam'
import { currentUser, readFacts, requireRole } from '../middleware/auth.ts'
import { requestNotifier, type SupervisionRouterOptions } from '../supervision/supervision.routes.ts'
import { patientCodeMask } from './exam-access.ts'
import { getExam, listExams, type Viewer } from './exam-queries.ts'
import { examRead } from './exam-answers.ts'
import { examCaches } from './exam-caches.ts'
import { createExam, submitExam, updateExam } from './exams.service.ts'

const IdParamsSchema = z.object({ id: z.string() })
const SubmitSchema = z.object({ baseVersion: z.number('Send the version this change is based on').int().min(1).optional() })

/** `secret` keys the pseudonyms that replace patient codes for readers who may not see them; `mailer` asks for countersignature. */
export function examsRouter(options: SupervisionRouterOptions): Router {
  const router = Router()
  const mask = patientCodeMask(options.secret)
  const notifier = requestNotifier(options)
  const viewer = (res: Response): Viewer => ({ user: currentUser(res), mask, facts: readFacts(res) })
  const idOf = (req: Request) => IdParamsSchema.parse(req.params).id
  const readers = requireRole('resident', 'attending', 'educator')
  const authors = requireRole('resident', 'attending')

  router.post('/estimate', readers, async (req, res) =>
    res.json(estimateWith(ExamFindingsSchema.parse(req.body), await estimateContext())),
  )
  router.get('/exams', readers, async (req, res) => {
    const [query, read] = [ExamListQuerySchema.parse(req.query), await examRead(viewer(res))]
    await examCaches().answers.send(req, res, read.keyOf('exams', query), () => listExams(viewer(res), query, read))
  })
  router.get('/exams/:id', async (req, res) => res.json(await getExam(viewer(res), idOf(req))))
  router.post('/exams', authors, async (req, res) => {
    const { exam, created } = await createExam(currentUser(res), ExamInputSchema.parse(req.body))
    res.status(created ? 201 : 200).json(exam)
  })
  router.patch('/exams/:id', authors, async (req, res) =>
    res.json(await updateExam(currentUser(res), idOf(req), ExamPatchSchema.parse(req.body))),
  )
  router.post('/exams/:id/submit', authors, async (req, res) => {
    const { baseVersion } = SubmitSchema.parse(req.body ?? {})
    res.json(await submitExam(currentUser(res), idOf(req), baseVersion, (row, transaction) => notifier.submitted(row, transaction)))
  })
  return router
}

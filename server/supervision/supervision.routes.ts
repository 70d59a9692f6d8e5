import { Router, type Request, type Response } from 'express'
import type { Logger } from 'pino'
import { z } from 'zod'
import { AmendInputSchema, CountersignInputSchema, ReturnInputSchema } from '#shared/schemas/signature'
import { SignoffQueueQuerySchema } from '#shared/schemas/signoff-queue'
import { patientCodeMask } from '../exams/exam-access.ts'
import { examRead } from '../exams/exam-answers.ts'
import { examCaches } from '../exams/exam-caches.ts'
import type { MailDeps } from '../mail/mailer.ts'
import { currentUser, readFacts, requireRole } from '../middleware/auth.ts'
import { countersignExam } from './countersign.service.ts'
import { examHistory, examSignatures } from './exam-records.service.ts'
import { createNotifier, type Notifier } from './notifications.ts'
import { amendExam, returnExam } from './review.service.ts'
import { signoffCount, signoffQueue, signoffResidents } from './signoff-queue.service.ts'

export interface SupervisionRouterOptions extends MailDeps {
  secret: string
  log: Logger
}

/** The workflow notifier; its links point at the configured base (PUBLIC_URL), never at a request's Host header. */
export function requestNotifier({ mailer, log, baseUrl }: Omit<SupervisionRouterOptions, 'secret'>): Notifier {
  return createNotifier({ mailer, log, baseUrl })
}

const IdParamsSchema = z.object({ id: z.string() })

/** Countersign, return, amend, signatures, history and the sign-off queue. Mount it behind `requireAuth`. */
export function supervisionRouter(options: SupervisionRouterOptions): Router {
  const router = Router()
  const mask = patientCodeMask(options.secret)
  const notifier = requestNotifier(options)
  const idOf = (req: Request) => IdParamsSchema.parse(req.params).id
  const bodyOf = (req: Request): unknown => req.body ?? {}
  const user = (res: Response) => currentUser(res)
  const attendings = requireRole('attending')

  router.post('/exams/:id/countersign', attendings, async (req, res) => {
    const { exam } = await countersignExam(user(res), idOf(req), CountersignInputSchema.parse(bodyOf(req)), notifier)
    res.json(exam)
  })
  router.post('/exams/:id/return', attendings, async (req, res) =>
    res.json(await returnExam(user(res), idOf(req), ReturnInputSchema.parse(bodyOf(req)), notifier)),
  )
  router.post('/exams/:id/amend', requireRole('resident', 'attending'), async (req, res) =>
    res.json(await amendExam(user(res), idOf(req), AmendInputSchema.parse(bodyOf(req)))),
  )
  router.get('/exams/:id/signatures', async (req, res) => res.json(await examSignatures(user(res), idOf(req))))
  router.get('/exams/:id/history', async (req, res) => res.json(await examHistory({ user: user(res), mask }, idOf(req))))
  router.get('/signoff-queue', attendings, async (req, res) => {
    const [query, read] = [SignoffQueueQuerySchema.parse(req.query), await examRead({ user: user(res), mask, facts: readFacts(res) })]
    await examCaches().answers.send(req, res, read.keyOf('signoff-queue', query), () => signoffQueue(user(res), query, read.cache))
  })
  router.get('/signoff-queue/count', attendings, async (_req, res) => res.json(await signoffCount(user(res))))
  router.get('/signoff-queue/residents', attendings, async (_req, res) => res.json(await signoffResidents(user(res))))
  return router
}

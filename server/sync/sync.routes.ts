import { Router } from 'express'
import { SyncPullQuerySchema } from '#shared/schemas/sync'
import { patientCodeMask } from '../exams/exam-access.ts'
import { currentUser, readFacts, requireRole } from '../middleware/auth.ts'
import { pullChanges } from './sync-pull.service.ts'
import { examRead } from '../exams/exam-answers.ts'
import { examCaches } from '../exams/exam-caches.ts'
import { pushChanges } from './sync-push.service.ts'
import { SyncBatchSchema } from './sync-items.ts'

/** The offline client's push and pull. Mount it behind `requireAuth`. */
export function syncRouter(options: { secret: string }): Router {
  const router = Router()
  const mask = patientCodeMask(options.secret)

  router.post('/push', requireRole('resident', 'attending'), async (req, res) =>
    res.json({ results: await pushChanges(currentUser(res), SyncBatchSchema.parse(req.body).changes) }),
  )
  router.get('/pull', requireRole('resident', 'attending', 'educator'), async (req, res) => {
    const [query, viewer] = [SyncPullQuerySchema.parse(req.query), { user: currentUser(res), mask, facts: readFacts(res) }]
    const read = await examRead(viewer)
    await examCaches().answers.send(req, res, read.keyOf('pull', query), () => pullChanges(viewer, query, read))
  })
  return router
}

import { Router, type Request, type Response } from 'express'
import { z } from 'zod'
import { RoundCreateSchema } from '#shared/schemas/round'
import { patientCodeMask } from '../exams/exam-access.ts'
import { currentUser, requireRole } from '../middleware/auth.ts'
import type { RoundViewer } from './round-presentation.ts'
import { closeRound, createRound, getRound, listRounds, roundResults } from './rounds.service.ts'

const IdParamsSchema = z.object({ id: z.string().min(1).max(64) })

/**
 * Blinded calibration rounds. Educators create and close them (admins hold no clinical role, so they do not);
 * residents and attendings take part. Every answer shows the patient codes as the viewer may see them: real to the
 * round's examiners, keyed pseudonyms to everyone else (its educator). Mount behind `requireAuth`.
 */
export function roundsRouter(options: { secret: string }): Router {
  const router = Router()
  const members = requireRole('resident', 'attending', 'educator')
  const educators = requireRole('educator')
  const idOf = (req: Request) => IdParamsSchema.parse(req.params).id
  const mask = patientCodeMask(options.secret)
  const viewer = (res: Response): RoundViewer => ({ user: currentUser(res), mask })

  router.post('/', educators, async (req, res) => {
    const { id } = await createRound(currentUser(res), RoundCreateSchema.parse(req.body))
    res.status(201).json(await getRound(viewer(res), id))
  })
  router.get('/', members, async (_req, res) => res.json({ rounds: await listRounds(viewer(res)) }))
  router.get('/:id', members, async (req, res) => res.json(await getRound(viewer(res), idOf(req))))
  router.post('/:id/close', educators, async (req, res) => {
    await closeRound(currentUser(res), idOf(req))
    res.json(await getRound(viewer(res), idOf(req)))
  })
  router.get('/:id/results', members, async (req, res) => res.json(await roundResults(viewer(res), idOf(req))))
  return router
}

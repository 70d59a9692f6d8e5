import { Router, type Request } from 'express'
import { z } from 'zod'
import { RoundCreateSchema } from '#shared/schemas/round'
import { currentUser, requireRole } from '../middleware/auth.ts'
import { closeRound, createRound, getRound, listRounds, roundResults } from './rounds.service.ts'

const IdParamsSchema = z.object({ id: z.string().min(1).max(64) })

/**
 * Blinded calibration rounds (§6). Educators create and close them (admins hold no clinical role, so they do not);
 * residents and attendings take part. Mount behind `requireAuth`.
 */
export function roundsRouter(): Router {
  const router = Router()
  const members = requireRole('resident', 'attending', 'educator')
  const educators = requireRole('educator')
  const idOf = (req: Request) => IdParamsSchema.parse(req.params).id

  router.post('/', educators, async (req, res) => res.status(201).json(await createRound(currentUser(res), RoundCreateSchema.parse(req.body))))
  router.get('/', members, async (_req, res) => res.json({ rounds: await listRounds(currentUser(res)) }))
  router.get('/:id', members, async (req, res) => res.json(await getRound(currentUser(res), idOf(req))))
  router.post('/:id/close', educators, async (req, res) => res.json(await closeRound(currentUser(res), idOf(req))))
  router.get('/:id/results', members, async (req, res) => res.json(await roundResults(currentUser(res), idOf(req))))
  return router
}

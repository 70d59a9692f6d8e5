import { Router } from 'express'
import { currentUser, requireRole } from '../middleware/auth.ts'
import { listTeamsFor, listUsers } from './users.service.ts'

export function usersRouter(): Router {
  const router = Router()
  router.get('/me', (_req, res) => res.json(currentUser(res)))
  router.get('/teams', requireRole('resident', 'attending', 'educator', 'admin'), async (_req, res) =>
    res.json({ teams: await listTeamsFor(currentUser(res)) }),
  )
  router.get('/admin/users', requireRole('admin'), async (_req, res) => res.json({ users: await listUsers() }))
  return router
}

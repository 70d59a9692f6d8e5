import { Router } from 'express'
import { MailboxSchema, OutboxQuerySchema } from '#shared/schemas/mail'
import { AppError } from '../errors.ts'
import type { FakeSmtp } from './fake-smtp.ts'
import { listOutbox } from './outbox.service.ts'

/**
 * `GET /outbox` → the durable outbox (queued, sent, failed; attempts and last error), and `GET /` → what the demo's fake
 * SMTP server caught, newest first (404 where none runs). Mount it behind the admin guard.
 */
export function mailboxRouter(fake?: Pick<FakeSmtp, 'messages'>): Router {
  const router = Router()
  router.get('/outbox', async (req, res) => res.json(await listOutbox(OutboxQuerySchema.parse(req.query))))
  router.get('/', (_req, res) => {
    if (!fake) throw new AppError('not-found', 404, 'No mail catcher runs on this server')
    res.json(MailboxSchema.parse({ messages: fake.messages().toReversed() }))
  })
  return router
}

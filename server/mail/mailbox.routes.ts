import { Router } from 'express'
import { MailboxSchema } from '#shared/schemas/mail'
import type { FakeSmtp } from './fake-smtp.ts'

/** `GET /` → what the fake SMTP server caught, newest first. Mount it behind the admin guard, and only in demo mode. */
export function mailboxRouter(fake: Pick<FakeSmtp, 'messages'>): Router {
  const router = Router()
  router.get('/', (_req, res) => {
    const messages = fake.messages().toReversed()
    res.json(MailboxSchema.parse({ messages }))
  })
  return router
}

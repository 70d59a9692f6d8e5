import { Router } from 'express'
import type { Logger } from 'pino'
import {
  AccountPatchSchema,
  AccountQuerySchema,
  InviteInputSchema,
  PASSWORD_RESET_ACCEPTED,
  PasswordResetRequestSchema,
  SetPasswordInputSchema,
} from '#shared/schemas/account'
import type { MailDeps } from '../mail/mailer.ts'
import { currentUser, requireRole } from '../middleware/auth.ts'
import { attemptLimiter, byAddress, byAddressAndEmail, textCredentials } from '../middleware/rate-limit.ts'
import {
  deactivateAccount,
  getAccount,
  inviteAccount,
  listAccounts,
  reactivateAccount,
  resendInvitation,
  updateAccount,
} from './accounts.service.ts'
import { runAfterResponse } from './background.ts'
import { requestPasswordReset, setPasswordWithLink } from './password-links.service.ts'

export type AccountsRouterOptions = MailDeps

/** Admin account management, mounted under `/api` behind requireAuth. */
export function accountsRouter({ mailer, baseUrl }: AccountsRouterOptions): Router {
  const router = Router()
  const admin = requireRole('admin')
  const mail = () => ({ mailer, baseUrl })

  router.get('/admin/accounts', admin, async (req, res) => res.json(await listAccounts(AccountQuerySchema.parse(req.query))))
  router.get('/admin/accounts/:id', admin, async (req, res) => res.json(await getAccount(String(req.params.id))))
  router.post('/admin/accounts', admin, async (req, res) =>
    res.status(201).json(await inviteAccount(InviteInputSchema.parse(req.body), currentUser(res), mail())),
  )
  router.patch('/admin/accounts/:id', admin, async (req, res) =>
    res.json(await updateAccount(String(req.params.id), AccountPatchSchema.parse(req.body), currentUser(res))),
  )
  router.post('/admin/accounts/:id/deactivate', admin, async (req, res) =>
    res.json(await deactivateAccount(String(req.params.id), currentUser(res))),
  )
  router.post('/admin/accounts/:id/reactivate', admin, async (req, res) =>
    res.json(await reactivateAccount(String(req.params.id), currentUser(res))),
  )
  router.post('/admin/accounts/:id/invitation', admin, async (req, res) =>
    res.json(await resendInvitation(String(req.params.id), currentUser(res), mail())),
  )
  return router
}

export interface AccountAuthRouterOptions extends AccountsRouterOptions {
  log: Logger
  /** Reset requests per address and e-mail in 15 minutes. */
  resetAttempts?: number
  /** Failed set-password attempts per address in 15 minutes. */
  setPasswordAttempts?: number
}

/** Public: `POST /password-reset` and `POST /set-password`, mounted at `/api/auth`. */
export function accountAuthRouter({ mailer, baseUrl, log, resetAttempts = 5, setPasswordAttempts = 10 }: AccountAuthRouterOptions): Router {
  const router = Router()
  const message = 'Too many attempts; wait 15 minutes'
  // Every request counts, for known and unknown e-mails alike, so the limit itself reveals nothing.
  const resetLimiter = attemptLimiter({ limit: resetAttempts, key: byAddressAndEmail, message })
  const setPasswordLimiter = attemptLimiter({ limit: setPasswordAttempts, key: byAddress, message, failuresOnly: true })

  // No account enumeration: the answer is sent before anything depends on the address (OWASP Forgot Password
  // Cheat Sheet: same message, same time), so known and unknown addresses get the same status, body and timing.
  router.post('/password-reset', textCredentials('email'), resetLimiter, (req, res) => {
    const input = PasswordResetRequestSchema.parse(req.body)
    res.status(202).json(PASSWORD_RESET_ACCEPTED)
    const mail = { mailer, baseUrl }
    runAfterResponse(log, 'password reset request', () => requestPasswordReset(input, mail))
  })
  router.post('/set-password', textCredentials('token', 'password'), setPasswordLimiter, async (req, res) => {
    res.json(await setPasswordWithLink(SetPasswordInputSchema.parse(req.body)))
  })
  return router
}

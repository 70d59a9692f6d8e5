import { Router } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import type { Logger } from 'pino'
import {
  AccountPatchSchema,
  AccountQuerySchema,
  InviteInputSchema,
  PASSWORD_RESET_ACCEPTED,
  PasswordResetRequestSchema,
  SetPasswordInputSchema,
} from '#shared/schemas/account'
import { AppError } from '../errors.ts'
import type { Mailer } from '../mail/mailer.ts'
import { currentUser, requireRole } from '../middleware/auth.ts'
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
import { setAccountMailDefaults } from './invitations.ts'
import { requestPasswordReset, setPasswordWithLink } from './password-links.service.ts'

export interface AccountsRouterOptions {
  mailer?: Mailer
  /** Base of links in e-mails (PUBLIC_URL); never the request's Host header, which the caller controls. */
  baseUrl: string
}

/** Admin account management, mounted under `/api` behind requireAuth. */
export function accountsRouter({ mailer, baseUrl }: AccountsRouterOptions): Router {
  setAccountMailDefaults({ mailer, baseUrl })
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

const WINDOW_MS = 15 * 60 * 1000

/** Public: `POST /password-reset` and `POST /set-password`, mounted at `/api/auth`. */
export function accountAuthRouter({ mailer, baseUrl, log, resetAttempts = 5, setPasswordAttempts = 10 }: AccountAuthRouterOptions): Router {
  const router = Router()
  const tooMany = () => new AppError('too-many-attempts', 429, 'Too many attempts; wait 15 minutes')
  // Counted per address and e-mail alike for known and unknown e-mails, so the limit itself reveals nothing.
  const resetLimiter = rateLimit({
    windowMs: WINDOW_MS,
    limit: resetAttempts,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String(req.body?.email ?? '').trim().toLowerCase()}`,
    handler: (_req, _res, next) => next(tooMany()),
  })
  const setPasswordLimiter = rateLimit({
    windowMs: WINDOW_MS,
    limit: setPasswordAttempts,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
    handler: (_req, _res, next) => next(tooMany()),
  })

  // No account enumeration: the answer is sent before anything depends on the address (OWASP Forgot Password
  // Cheat Sheet: same message, same time), so known and unknown addresses get the same status, body and timing.
  router.post('/password-reset', resetLimiter, (req, res) => {
    const input = PasswordResetRequestSchema.parse(req.body)
    res.status(202).json(PASSWORD_RESET_ACCEPTED)
    const mail = { mailer, baseUrl }
    runAfterResponse(log, 'password reset request', () => requestPasswordReset(input, mail))
  })
  router.post('/set-password', setPasswordLimiter, async (req, res) => {
    res.json(await setPasswordWithLink(SetPasswordInputSchema.parse(req.body)))
  })
  return router
}

import { existsSync } from 'node:fs'
import express, { type Express, type NextFunction, type Request, type Response } from 'express'
import cookieParser from 'cookie-parser'
import helmet from 'helmet'
import type { Logger } from 'pino'
import type { Sequelize } from 'sequelize'
import { accountAuthRouter, accountsRouter } from './accounts/accounts.routes.ts'
import { agreementRouter } from './agreement/agreement.routes.ts'
import { attachmentsRouter } from './attachments/attachments.routes.ts'
import { auditTrailRouter } from './audit-trail/audit-trail.routes.ts'
import { authRouter } from './auth/auth.routes.ts'
import { AppError } from './errors.ts'
import { examsRouter } from './exams/exams.routes.ts'
import { exportsRouter } from './exports/exports.routes.ts'
import type { FakeSmtp } from './mail/fake-smtp.ts'
import { mailboxRouter } from './mail/mailbox.routes.ts'
import { learningRouter } from './learning/learning.routes.ts'
import type { Mailer } from './mail/mailer.ts'
import type { Models } from './models/index.ts'
import { requireAuth, requireRole } from './middleware/auth.ts'
import { errorHandler } from './middleware/error-handler.ts'
import { bodyGuard, pathAndQueryGuard } from './middleware/input-guard.ts'
import { patientsRouter } from './patients/patients.routes.ts'
import { accuracyRouter, referencesRouter } from './references/references.routes.ts'
import { compressAnswers } from './http/compression.ts'
import { serveClient } from './http/static-files.ts'
import { rosterRouter } from './roster/roster.routes.ts'
import { adminSettingsRouter, settingsRouter } from './settings/settings.routes.ts'
import { roundsRouter } from './rounds/rounds.routes.ts'
import { supervisionRouter } from './supervision/supervision.routes.ts'
import { syncRouter } from './sync/sync.routes.ts'
import { usersRouter } from './users/users.routes.ts'

export interface AppDeps {
  /** The open, migrated database; the app never opens or closes it. */
  sequelize: Sequelize
  /** `initModels(sequelize)`: every model, bound to that database. */
  models: Models
  secret: string
  log: Logger
  demo: boolean
  cookieSecure?: boolean
  /** Folder of the built client; omitted in API-only tests. */
  clientDir?: string
  loginAttempts?: number
  jsonLimit?: string
  /** Sends workflow e-mails; API tests may leave it out. */
  mailer?: Mailer
  /** The demo's fake SMTP server; when present, admins read what it caught at /api/mailbox (the outbox is always there). */
  mailbox?: Pick<FakeSmtp, 'messages'>
  /** Base of links in e-mails (PUBLIC_URL); never taken from a request's Host header, which the caller controls. */
  baseUrl: string
  /** Where exam photos are written (DATA_DIR/attachments), outside the web root; a temp folder when omitted. */
  attachmentsDir?: string
}

function requestLog(log: Logger) {
  return (req: Request, res: Response, next: NextFunction) => {
    const started = process.hrtime.bigint()
    // The path only: query strings may carry patient codes, headers carry tokens.
    res.on('finish', () =>
      log.info({ method: req.method, path: req.originalUrl.split('?')[0], status: res.statusCode, ms: Number(process.hrtime.bigint() - started) / 1e6 }),
    )
    next()
  }
}

/** Every model must be bound to the injected database: a model left on another connection would write elsewhere. */
function checkModels({ sequelize, models }: Pick<AppDeps, 'sequelize' | 'models'>): void {
  const stray = Object.entries(models).filter(([, model]) => model.sequelize !== sequelize)
  if (stray.length) throw new Error(`Models not bound to the given database: ${stray.map(([name]) => name).join(', ')}`)
}

/** Builds the HTTP app on the injected database; the caller owns the connection and `listen`. */
export function createApp(deps: AppDeps): Express {
  checkModels(deps)
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')
  app.use(helmet({ contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } } }))
  app.use(requestLog(deps.log))
  app.use('/api', compressAnswers())
  app.use('/api', (_req, res, next) => {
    res.set('Cache-Control', 'no-store')
    next()
  })
  app.use(pathAndQueryGuard)
  // A sync push checks each change on its own (server/sync), so one bad record does not fail the batch.
  app.use('/api', express.json({ limit: deps.jsonLimit ?? '256kb' }), cookieParser(), bodyGuard(['/sync/push']))
  app.get('/api/health', (_req, res) => res.json({ status: 'ok', demo: deps.demo }))
  app.use(
    '/api/auth',
    authRouter({ secret: deps.secret, cookieSecure: deps.cookieSecure ?? true, loginAttempts: deps.loginAttempts ?? 10 }),
  )
  app.use('/api/auth', accountAuthRouter({ log: deps.log, mailer: deps.mailer, baseUrl: deps.baseUrl }))
  app.use('/api/mailbox', requireAuth(deps.secret), requireRole('admin'), mailboxRouter(deps.mailbox))
  app.use('/api/agreement/accuracy', requireAuth(deps.secret), accuracyRouter())
  app.use('/api/agreement/mine', requireAuth(deps.secret), learningRouter({ secret: deps.secret }))
  app.use('/api/agreement', requireAuth(deps.secret), agreementRouter({ secret: deps.secret }))
  app.use('/api/patients', requireAuth(deps.secret), patientsRouter())
  app.use('/api/sync', requireAuth(deps.secret), syncRouter({ secret: deps.secret }))
  app.use('/api/rounds', requireAuth(deps.secret), roundsRouter({ secret: deps.secret }))
  app.use('/api/settings', requireAuth(deps.secret), settingsRouter())
  app.use('/api/admin/settings', requireAuth(deps.secret), requireRole('admin'), adminSettingsRouter())
  app.use('/api/admin/roster', requireAuth(deps.secret), requireRole('admin'), rosterRouter({ log: deps.log, mailer: deps.mailer, baseUrl: deps.baseUrl }))
  app.use('/api', attachmentsRouter({ secret: deps.secret, dir: deps.attachmentsDir }))
  const exams = { secret: deps.secret, log: deps.log, mailer: deps.mailer, baseUrl: deps.baseUrl }
  app.use('/api', requireAuth(deps.secret), usersRouter(), examsRouter(exams), supervisionRouter(exams), auditTrailRouter(exams))
  app.use('/api', requireAuth(deps.secret), referencesRouter())
  app.use('/api', requireAuth(deps.secret), exportsRouter({ secret: deps.secret }))
  app.use('/api', requireAuth(deps.secret), accountsRouter({ mailer: deps.mailer, baseUrl: deps.baseUrl }))
  app.use('/api', () => {
    throw new AppError('not-found', 404, 'No such API route')
  })
  if (deps.clientDir && existsSync(deps.clientDir)) serveClient(app, deps.clientDir)
  app.use(errorHandler(deps.log))
  return app
}

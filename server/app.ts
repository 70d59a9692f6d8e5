import { existsSync } from 'node:fs'
import path from 'node:path'
import express, { type Express, type NextFunction, type Request, type Response } from 'express'
import cookieParser from 'cookie-parser'
import helmet from 'helmet'
import type { Logger } from 'pino'
import { authRouter } from './auth/auth.routes.ts'
import { AppError } from './errors.ts'
import { requireAuth } from './middleware/auth.ts'
import { errorHandler } from './middleware/error-handler.ts'
import { usersRouter } from './users/users.routes.ts'

export interface AppDeps {
  secret: string
  log: Logger
  demo: boolean
  cookieSecure?: boolean
  /** Folder of the built client; omitted in API-only tests. */
  clientDir?: string
  loginAttempts?: number
  jsonLimit?: string
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

function serveClient(app: Express, dir: string) {
  app.use(express.static(dir, { index: false }))
  app.use((req, res, next) => {
    if (req.method !== 'GET' || req.path.startsWith('/api')) return next()
    res.sendFile(path.join(dir, 'index.html'))
  })
}

/** Builds the HTTP app; the caller owns the database connection and `listen`. */
export function createApp(deps: AppDeps): Express {
  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')
  app.use(helmet({ contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } } }))
  app.use(requestLog(deps.log))
  app.use('/api', (_req, res, next) => {
    res.set('Cache-Control', 'no-store')
    next()
  })
  app.use('/api', express.json({ limit: deps.jsonLimit ?? '256kb' }), cookieParser())
  app.get('/api/health', (_req, res) => res.json({ status: 'ok', demo: deps.demo }))
  app.use(
    '/api/auth',
    authRouter({ secret: deps.secret, cookieSecure: deps.cookieSecure ?? true, loginAttempts: deps.loginAttempts ?? 10 }),
  )
  app.use('/api', requireAuth(deps.secret), usersRouter())
  app.use('/api', () => {
    throw new AppError('not-found', 404, 'No such API route')
  })
  if (deps.clientDir && existsSync(deps.clientDir)) serveClient(app, deps.clientDir)
  app.use(errorHandler(deps.log))
  return app
}

import { Router, type Request, type Response } from 'express'
import multer from 'multer'
import type { Logger } from 'pino'
import { ROSTER_MAX_BYTES, type RosterApplyResult } from '#shared/schemas/roster'
import { AppError } from '../errors.ts'
import type { MailDeps } from '../mail/mailer.ts'
import { currentUser } from '../middleware/auth.ts'
import { parseRoster, rosterText } from './roster-file.ts'
import { applyRoster, previewRoster } from './roster.service.ts'

export interface RosterRouterOptions extends MailDeps {
  log: Logger
}

const FIELD = 'file'
const MB = ROSTER_MAX_BYTES / (1024 * 1024)

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: ROSTER_MAX_BYTES, files: 1, fields: 4, parts: 5, fieldSize: 1024 },
}).single(FIELD)

function uploadError(err: unknown): AppError {
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') {
      const message = `The file is larger than ${MB} MB; a roster must be at most ${MB} MB.`
      return new AppError('roster-too-large', 413, message, { file: message })
    }
    const message = `Send exactly one CSV file, in the form field "${FIELD}".`
    return new AppError('roster-upload', 400, message, { file: message })
  }
  const message = 'The upload was cut off or is not a valid multipart form.'
  return new AppError('roster-upload', 400, message, { file: message })
}

/** The uploaded roster, checked as text and parsed; nothing about the file is taken from its name or declared type. */
async function receiveRoster(req: Request, res: Response) {
  await new Promise<void>((resolve, reject) => upload(req, res, (err: unknown) => (err ? reject(uploadError(err)) : resolve())))
  if (!req.file) {
    const message = `Choose a CSV file to upload (form field "${FIELD}").`
    throw new AppError('roster-missing', 400, message, { file: message })
  }
  return parseRoster(await rosterText(req.file.buffer))
}

/** Roster import for admins (issue 7). Mount it behind `requireAuth` and `requireRole('admin')`. */
export function rosterRouter(options: RosterRouterOptions): Router {
  const router = Router()
  router.post('/preview', async (req, res) => {
    res.json(await previewRoster(await receiveRoster(req, res), currentUser(res)))
  })
  router.post('/apply', async (req, res) => {
    const file = await receiveRoster(req, res)
    const applied = await applyRoster(file, currentUser(res), { mailer: options.mailer, baseUrl: options.baseUrl })
    const result: RosterApplyResult = { ...applied.preview, created: applied.created, updated: applied.updated, skipped: applied.skipped }
    res.json(result)
  })
  return router
}

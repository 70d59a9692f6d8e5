import { Router, type Request, type Response } from 'express'
import multer from 'multer'
import { z } from 'zod'
import { ATTACHMENT_MAX_BYTES } from '#shared/schemas/attachment'
import { AppError, invalidInput } from '../errors.ts'
import { currentUser, requireAuth, requireRole } from '../middleware/auth.ts'
import { attachmentStore } from './attachment-files.ts'
import { addAttachment, deleteAttachment, listAttachments, readAttachment } from './attachments.service.ts'

export interface AttachmentsRouterOptions {
  secret: string
  /** The folder photos are written to (DATA_DIR/attachments); a temp folder when omitted. */
  dir?: string
}

const IdParamsSchema = z.object({ id: z.string() })
const MB = ATTACHMENT_MAX_BYTES / (1024 * 1024)

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: ATTACHMENT_MAX_BYTES, files: 1, fields: 4, fieldSize: 1024, parts: 5 },
}).single('file')

const UNREADABLE = 'The upload was cut off or is not a valid multipart form'

/** Multer's limits as field errors; anything else busboy throws (no closing boundary, a broken header) is the sender's 400. */
function uploadError(err: unknown): AppError {
  if (!(err instanceof multer.MulterError)) return new AppError('invalid-input', 400, UNREADABLE, { file: UNREADABLE })
  if (err.code === 'LIMIT_FILE_SIZE')
    return new AppError('too-large', 413, `A photo may be at most ${MB} MB`, { file: `The photo is over ${MB} MB` })
  if (err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_UNEXPECTED_FILE')
    return invalidInput({ file: 'Send one photo per request, in the field "file"' })
  return new AppError('invalid-input', 400, 'The upload could not be read', { _: err.message })
}

/** Reads the multipart body into memory (at most one file of 5 MB); an oversized photo answers 413. */
function receive(req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => upload(req, res, (err: unknown) => (err ? reject(uploadError(err)) : resolve())))
}

/** Photos of an exam's measurement set-up: `/exams/:id/attachments` and `/attachments/:id`, mounted under `/api`. */
export function attachmentsRouter(options: AttachmentsRouterOptions): Router {
  const router = Router()
  const store = attachmentStore(options.dir)
  const auth = requireAuth(options.secret)
  const authors = requireRole('resident', 'attending')
  const readers = requireRole('resident', 'attending', 'educator')
  const idOf = (req: Request) => IdParamsSchema.parse(req.params).id

  router.post('/exams/:id/attachments', auth, authors, async (req, res) => {
    await receive(req, res)
    const { attachment, created } = await addAttachment(store, currentUser(res), idOf(req), req.body, req.file)
    res.status(created ? 201 : 200).json(attachment)
  })
  router.get('/exams/:id/attachments', auth, readers, async (req, res) =>
    res.json({ attachments: await listAttachments(currentUser(res), idOf(req)) }),
  )
  router.get('/attachments/:id', auth, readers, async (req, res) => {
    const { attachment, bytes } = await readAttachment(store, currentUser(res), idOf(req))
    res.set({
      'Content-Type': attachment.mimeType,
      'X-Content-Type-Options': 'nosniff',
      'Content-Disposition': `inline; filename="${attachment.displayName}"`,
      'Cache-Control': 'private, no-store',
      // Opened on its own, the image runs no script and loads nothing.
      'Content-Security-Policy': "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox",
    })
    res.send(bytes)
  })
  router.delete('/attachments/:id', auth, authors, async (req, res) => {
    await deleteAttachment(store, currentUser(res), idOf(req))
    res.status(204).end()
  })
  return router
}

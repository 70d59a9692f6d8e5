import type { NextFunction, Request, Response } from 'express'
import { ZodError } from 'zod'
import type { Logger } from 'pino'
import { AppError, fieldsOf, invalidInput } from '../errors.ts'

/** What body-parser, multer's busboy, the router and zlib attach to the errors they throw (http-errors). */
interface HttpLikeError {
  status?: number
  type?: string
  code?: string
}

/** Body-parser's error types (https://github.com/expressjs/body-parser#errors) that the client caused. */
const BODY_ERRORS: Record<string, AppError> = {
  'entity.too.large': new AppError('too-large', 413, 'The request is too large'),
  'entity.parse.failed': new AppError('invalid-json', 400, 'The request body is not valid JSON'),
  'charset.unsupported': new AppError('unsupported-charset', 415, 'Send the body as UTF-8'),
  'encoding.unsupported': new AppError('unsupported-encoding', 415, 'Send the body uncompressed, or as gzip, deflate or br'),
  'entity.verify.failed': new AppError('invalid-body', 400, 'The request body could not be read'),
}

/** Any error a client caused (a 4xx from a library, e.g. a gzip body that is not gzip) as one of ours; anything else stays a 500. */
function asAppError(thrown: unknown): AppError | null {
  if (thrown instanceof ZodError) return invalidInput(fieldsOf(thrown))
  if (thrown instanceof AppError) return thrown
  const http = (thrown ?? {}) as HttpLikeError
  const known = http.type ? BODY_ERRORS[http.type] : undefined
  if (known) return known
  // zlib's errors (Z_DATA_ERROR…): a body that does not decode as its Content-Encoding says.
  if (http.code?.startsWith('Z_')) return new AppError('invalid-body', 400, 'The body does not match its Content-Encoding')
  if (typeof http.status === 'number' && http.status >= 400 && http.status < 500)
    return new AppError(http.status === 415 ? 'unsupported-media-type' : 'invalid-request', http.status, 'The request could not be read')
  return null
}

export function errorHandler(log: Logger) {
  return (thrown: unknown, _req: Request, res: Response, next: NextFunction) => {
    // Once the answer has started, only Express can end it (it closes the connection).
    if (res.headersSent) return next(thrown)
    const err = asAppError(thrown)
    if (err) {
      res.status(err.status).json({ ...err.extra, error: { code: err.code, message: err.message, fields: err.fields } })
      return
    }
    log.error({ err: thrown }, 'unhandled error')
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server' } })
  }
}

import type { NextFunction, Request, Response } from 'express'
import { ZodError } from 'zod'
import type { Logger } from 'pino'
import { AppError, fieldsOf, invalidInput } from '../errors.ts'

interface HttpLikeError {
  status?: number
  type?: string
}

export function errorHandler(log: Logger) {
  return (thrown: unknown, _req: Request, res: Response, _next: NextFunction) => {
    const err = thrown instanceof ZodError ? invalidInput(fieldsOf(thrown)) : thrown
    if (err instanceof AppError) {
      res.status(err.status).json({ ...err.extra, error: { code: err.code, message: err.message, fields: err.fields } })
      return
    }
    const http = err as HttpLikeError
    if (http.type === 'entity.too.large') {
      res.status(413).json({ error: { code: 'too-large', message: 'The request is too large' } })
      return
    }
    if (http.type === 'entity.parse.failed') {
      res.status(400).json({ error: { code: 'invalid-json', message: 'The request body is not valid JSON' } })
      return
    }
    log.error({ err }, 'unhandled error')
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server' } })
  }
}

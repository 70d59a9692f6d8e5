import type { ZodError } from 'zod'

export class AppError extends Error {
  readonly code: string
  readonly status: number
  readonly fields?: Record<string, string>
  /** Sent beside `error` in the body, e.g. the server's copy with a 409. */
  readonly extra?: Record<string, unknown>

  constructor(code: string, status: number, message: string, fields?: Record<string, string>, extra?: Record<string, unknown>) {
    super(message)
    this.code = code
    this.status = status
    this.fields = fields
    this.extra = extra
  }
}

export const FIELDS_MESSAGE = 'Some fields need attention'

/** A 400 naming each field to fix and why, as the client shows it beside the field. */
export const invalidInput = (fields: Record<string, string>): AppError => new AppError('invalid-input', 400, FIELDS_MESSAGE, fields)

/** A schema's complaints as field messages: the first per field, keyed by its dotted path (`_` for the whole value). */
export function fieldsOf(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {}
  for (const issue of error.issues) fields[issue.path.join('.') || '_'] ??= issue.message
  return fields
}

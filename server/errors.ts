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

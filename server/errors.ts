export class AppError extends Error {
  readonly code: string
  readonly status: number
  readonly fields?: Record<string, string>

  constructor(code: string, status: number, message: string, fields?: Record<string, string>) {
    super(message)
    this.code = code
    this.status = status
    this.fields = fields
  }
}

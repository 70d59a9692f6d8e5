import { pino, type DestinationStream, type Logger } from 'pino'

// Never in a log line: credentials, and patient codes, including the values a database error carries.
export const REDACTED_PATHS = [
  'password',
  '*.password',
  'token',
  '*.token',
  'patientCode',
  '*.patientCode',
  'err.sql',
  'err.parameters',
  'err.fields',
  'err.errors',
  'err.original',
  'err.parent',
]

export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options = { level, redact: REDACTED_PATHS }
  return destination ? pino(options, destination) : pino(options)
}

import { pino } from 'pino'

export interface LogLine {
  level: number
  msg: string
  [key: string]: unknown
}

/** A real pino logger whose lines land in an array the test can read. */
export function captureLog() {
  const lines: LogLine[] = []
  const log = pino({ level: 'debug' }, { write: (line: string) => void lines.push(JSON.parse(line) as LogLine) })
  return { log, lines, messages: () => lines.map((line) => line.msg) }
}

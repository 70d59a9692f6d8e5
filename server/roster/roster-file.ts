import { fileTypeFromBuffer } from 'file-type'
import Papa from 'papaparse'
import { ROSTER_MAX_ROWS } from '#shared/schemas/roster'
import { AppError } from '../errors.ts'

/** The columns a roster must have, and the header spellings accepted for each (compared without case, spaces or punctuation). */
export const ROSTER_COLUMNS = {
  email: ['email', 'emailaddress', 'mail'],
  displayName: ['displayname', 'name', 'fullname'],
  roles: ['roles', 'role'],
  team: ['team', 'teams', 'teamname', 'ward'],
} as const
export type RosterColumn = keyof typeof ROSTER_COLUMNS

const COLUMN_LABELS: Record<RosterColumn, string> = { email: 'email', displayName: 'display name', roles: 'roles', team: 'team' }

/** One data row as written in the file (cells trimmed), before any check against the database. */
export interface RosterLine {
  /** Line of the file where the row starts; the header is line 1. */
  line: number
  email: string
  displayName: string
  roles: string
  team: string
  /** A problem with the row as a whole, e.g. more cells than the header names. */
  rowProblem?: string
}

export interface RosterFile {
  lines: RosterLine[]
  ignoredColumns: string[]
}

const fileError = (status: number, code: string, message: string) => new AppError(code, status, message, { file: message })

const UTF8_BOM = [0xef, 0xbb, 0xbf]
const startsWith = (bytes: Uint8Array, prefix: number[]) => prefix.every((b, i) => bytes[i] === b)

/** Index of the first byte that does not belong to well-formed UTF-8 (RFC 3629), or -1. */
export function firstInvalidUtf8(bytes: Uint8Array): number {
  let i = 0
  while (i < bytes.length) {
    const b = bytes[i]!
    if (b < 0x80) {
      i += 1
      continue
    }
    // Lead byte → sequence length and the allowed range of the second byte (no overlongs, surrogates or > U+10FFFF).
    let length: number
    let lo = 0x80
    let hi = 0xbf
    if (b >= 0xc2 && b <= 0xdf) length = 2
    else if (b >= 0xe0 && b <= 0xef) {
      length = 3
      if (b === 0xe0) lo = 0xa0
      if (b === 0xed) hi = 0x9f
    } else if (b >= 0xf0 && b <= 0xf4) {
      length = 4
      if (b === 0xf0) lo = 0x90
      if (b === 0xf4) hi = 0x8f
    } else return i
    for (let k = 1; k < length; k++) {
      const c = bytes[i + k]
      if (c === undefined) return i
      if (k === 1 ? c < lo || c > hi : c < 0x80 || c > 0xbf) return i
    }
    i += length
  }
  return -1
}

const lineAt = (bytes: Uint8Array, index: number) => 1 + bytes.subarray(0, index).filter((b) => b === 0x0a).length

function describeType(type: { ext: string; mime: string }): string {
  if (type.ext === 'xlsx' || type.ext === 'xls') return 'a spreadsheet workbook (XLSX/XLS)'
  if (type.ext === 'ods') return 'a spreadsheet document'
  if (type.ext === 'zip') return 'a ZIP archive'
  if (type.ext === 'pdf') return 'a PDF document'
  if (type.mime.startsWith('image/')) return `a ${type.ext.toUpperCase()} image`
  return `a ${type.ext.toUpperCase()} file (${type.mime})`
}

const SAVE_AS = 'In your spreadsheet, save the roster as comma-separated text in UTF-8 and upload that file.'

/**
 * The file's text, judged by its bytes (never by its name or the client's MIME type): a known binary signature, a NUL byte,
 * UTF-16 or bytes that are not UTF-8 are refused with 415 and a message saying what the file is; a UTF-8 BOM is dropped.
 */
export async function rosterText(bytes: Uint8Array): Promise<string> {
  if (startsWith(bytes, [0xff, 0xfe]) || startsWith(bytes, [0xfe, 0xff])) {
    throw fileError(415, 'roster-encoding', `The file is encoded as UTF-16, not UTF-8. ${SAVE_AS}`)
  }
  const type = await fileTypeFromBuffer(bytes)
  if (type) throw fileError(415, 'roster-not-csv', `This file is ${describeType(type)}, not a CSV text file. ${SAVE_AS}`)
  const nul = bytes.indexOf(0)
  if (nul >= 0) {
    throw fileError(
      415,
      'roster-not-csv',
      `This is not a CSV text file: it contains binary data (a NUL byte at byte ${nul + 1}). ${SAVE_AS}`,
    )
  }
  const body = startsWith(bytes, UTF8_BOM) ? bytes.subarray(UTF8_BOM.length) : bytes
  const bad = firstInvalidUtf8(body)
  if (bad >= 0) {
    const byte = body[bad]!.toString(16).toUpperCase().padStart(2, '0')
    throw fileError(
      415,
      'roster-encoding',
      `The file is not valid UTF-8 text: byte 0x${byte} on line ${lineAt(body, bad)} is not UTF-8. ` +
        `It was probably saved as Windows-1252 or Latin-1. ${SAVE_AS}`,
    )
  }
  return new TextDecoder('utf-8').decode(body)
}

const headerKey = (cell: string) => cell.normalize('NFKC').toLowerCase().replace(/[^\p{L}\p{N}]/gu, '')

function columnOf(cell: string): RosterColumn | undefined {
  const key = headerKey(cell)
  return (Object.keys(ROSTER_COLUMNS) as RosterColumn[]).find((c) => (ROSTER_COLUMNS[c] as readonly string[]).includes(key))
}

/** Comma, semicolon or tab: whichever the header line uses (column names contain none of them). */
function delimiterOf(text: string): string {
  const header = text.slice(0, text.indexOf('\n') >= 0 ? text.indexOf('\n') : text.length)
  const counts = [',', ';', '\t'].map((d) => [d, header.split(d).length - 1] as const)
  return counts.reduce((best, c) => (c[1] > best[1] ? c : best))[0]
}

interface RawRow {
  line: number
  cells: string[]
}

function readRows(text: string): RawRow[] {
  const rows: RawRow[] = []
  let start = 0
  let nextLine = 1
  Papa.parse<string[]>(text, {
    delimiter: delimiterOf(text),
    newline: '\n',
    step: (result, handle) => {
      const line = nextLine
      for (let i = start; i < result.meta.cursor; i++) if (text.charCodeAt(i) === 10) nextLine += 1
      start = result.meta.cursor
      const quotes = result.errors.find((e) => e.type === 'Quotes')
      if (quotes) {
        const what = quotes.code === 'MissingQuotes' ? 'a quoted value is never closed' : 'a quote mark is misplaced'
        throw fileError(400, 'roster-malformed', `The file is not well-formed CSV: on line ${line}, ${what}.`)
      }
      const cells = result.data.map((c) => c.trim())
      if (cells.every((c) => c === '')) return
      rows.push({ line, cells })
      // The header and one row past the limit are enough to know the file is too long.
      if (rows.length > ROSTER_MAX_ROWS + 1) handle.abort()
    },
  })
  return rows
}

function headerOf(cells: string[]) {
  const columns = new Map<RosterColumn, number>()
  const ignored: string[] = []
  cells.forEach((cell, index) => {
    const column = columnOf(cell)
    if (!column) {
      if (cell !== '') ignored.push(cell)
      return
    }
    if (columns.has(column)) {
      throw fileError(400, 'roster-header', `The header names the ${COLUMN_LABELS[column]} column twice ("${cells[columns.get(column)!]}" and "${cell}").`)
    }
    columns.set(column, index)
  })
  const expected = 'The first line must be a header row naming the columns: email, display name, roles, team.'
  if (columns.size === 0) {
    const looksLikeData = cells.some((c) => c.includes('@'))
    throw fileError(400, 'roster-no-header', looksLikeData ? `${expected} Line 1 looks like data, not a header.` : expected)
  }
  const missing = (Object.keys(ROSTER_COLUMNS) as RosterColumn[]).filter((c) => !columns.has(c))
  if (missing.length) {
    const list = missing.map((c) => COLUMN_LABELS[c]).join(', ')
    throw fileError(400, 'roster-header', `The header row lacks the column${missing.length > 1 ? 's' : ''}: ${list}. ${expected}`)
  }
  return { columns: columns as Map<RosterColumn, number>, width: cells.length, ignored }
}

/** Reads a roster's text: header row, then one account per row; blank lines are skipped. Throws on a file that cannot be read as a whole. */
export function parseRoster(text: string): RosterFile {
  const rows = readRows(text.replace(/\r\n?/g, '\n'))
  if (rows.length === 0) throw fileError(400, 'roster-empty', 'The file is empty.')
  const [header, ...data] = rows as [RawRow, ...RawRow[]]
  const { columns, width, ignored } = headerOf(header.cells)
  if (data.length === 0) throw fileError(400, 'roster-no-rows', 'The file has a header row but no accounts below it.')
  if (data.length > ROSTER_MAX_ROWS) {
    throw fileError(413, 'roster-too-many-rows', `The file has more than ${ROSTER_MAX_ROWS} accounts; split it into smaller files.`)
  }
  const cell = (row: RawRow, column: RosterColumn) => row.cells[columns.get(column)!] ?? ''
  return {
    ignoredColumns: ignored,
    lines: data.map((row) => {
      const extra = row.cells.slice(width).filter((c) => c !== '').length
      const rowProblem =
        row.cells.length < width
          ? `The line has ${row.cells.length} value${row.cells.length === 1 ? '' : 's'}; the header names ${width} columns.`
          : extra > 0
            ? `The line has ${extra} value${extra === 1 ? '' : 's'} more than the header names.`
            : undefined
      return {
        line: row.line,
        email: cell(row, 'email'),
        displayName: cell(row, 'displayName'),
        roles: cell(row, 'roles'),
        team: cell(row, 'team'),
        ...(rowProblem && { rowProblem }),
      }
    }),
  }
}

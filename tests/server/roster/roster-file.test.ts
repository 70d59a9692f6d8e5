import { describe, expect, it } from 'vitest'
import { AppError } from '../../../server/errors.ts'
import { firstInvalidUtf8, parseRoster, rosterText } from '../../../server/roster/roster-file.ts'

const bytes = (...b: number[]) => Uint8Array.from(b)

async function refusal(work: () => unknown): Promise<AppError> {
  try {
    await work()
  } catch (e) {
    if (e instanceof AppError) return e
    throw e
  }
  throw new Error('expected a refusal')
}

describe('firstInvalidUtf8', () => {
  // Byte patterns from RFC 3629 section 4 (the UTF-8 syntax) and the Unicode Standard's Table 3-7 (well-formed byte
  // sequences).
  it('accepts ASCII, 2-, 3- and 4-byte sequences', () => {
    expect(firstInvalidUtf8(new TextEncoder().encode('a é — 𝄞'))).toBe(-1)
  })

  it('finds a Latin-1 "é" (0xE9 followed by ASCII)', () => {
    expect(firstInvalidUtf8(bytes(0x61, 0x62, 0xe9, 0x2c))).toBe(2)
  })

  it('refuses overlong encodings, surrogates and code points above U+10FFFF', () => {
    expect(firstInvalidUtf8(bytes(0xc0, 0xaf))).toBe(0)
    expect(firstInvalidUtf8(bytes(0xe0, 0x80, 0xaf))).toBe(0)
    expect(firstInvalidUtf8(bytes(0xed, 0xa0, 0x80))).toBe(0)
    expect(firstInvalidUtf8(bytes(0xf4, 0x90, 0x80, 0x80))).toBe(0)
  })

  it('refuses a sequence cut off at the end', () => {
    expect(firstInvalidUtf8(bytes(0x41, 0xe2, 0x80))).toBe(1)
  })
})

describe('rosterText', () => {
  it('drops a UTF-8 byte order mark', async () => {
    const text = await rosterText(bytes(0xef, 0xbb, 0xbf, ...new TextEncoder().encode('email')))

    expect(text).toBe('email')
  })

  it('names UTF-16 as the problem', async () => {
    const error = await refusal(() => rosterText(bytes(0xff, 0xfe, 0x65, 0x00, 0x6d, 0x00)))

    expect(error.status).toBe(415)
    expect(error.message).toContain('UTF-16')
  })
})

describe('parseRoster', () => {
  it('accepts other header spellings, in any order, and ignores unknown columns', () => {
    const file = parseRoster('Team;Full Name;E-Mail Address;Role;Pager\nMedical ICU;Dr A;a@x.test;resident;1234\n')

    expect(file.lines).toEqual([{ line: 2, email: 'a@x.test', displayName: 'Dr A', roles: 'resident', team: 'Medical ICU' }])
    expect(file.ignoredColumns).toEqual(['Pager'])
  })

  it('numbers rows by the file line they start on, across blank lines, CRLF and quoted line breaks', () => {
    const file = parseRoster('email,name,roles,team\r\n\r\na@x.test,"Dr\nA",resident,\r\nb@x.test,Dr B,resident,\n')

    expect(file.lines.map((l) => [l.line, l.email])).toEqual([
      [3, 'a@x.test'],
      [5, 'b@x.test'],
    ])
  })

  it('flags a row with more values than the header names, but not trailing empty cells', () => {
    const file = parseRoster('email,name,roles,team\na@x.test,Dr A,resident,,,\nb@x.test,Dr B,resident,,oops\nc@x.test,Dr C\n')

    expect(file.lines[0]!.rowProblem).toBeUndefined()
    expect(file.lines[1]!.rowProblem).toBe('The line has 1 value more than the header names.')
    expect(file.lines[2]!.rowProblem).toBe('The line has 2 values; the header names 4 columns.')
  })

  it('refuses a file without a header row, saying line 1 looks like data', async () => {
    const error = await refusal(() => parseRoster('a@x.test,Dr A,resident,Medical ICU\n'))

    expect(error).toMatchObject({ status: 400, code: 'roster-no-header' })
    expect(error.message).toContain('Line 1 looks like data')
  })

  it('names the missing columns', async () => {
    const error = await refusal(() => parseRoster('email,name\na@x.test,Dr A\n'))

    expect(error).toMatchObject({ status: 400, code: 'roster-header' })
    expect(error.message).toContain('lacks the columns: roles, team')
  })

  it('refuses a header naming a column twice', async () => {
    const error = await refusal(() => parseRoster('email,e-mail,name,roles,team\n'))

    expect(error.message).toContain('names the email column twice')
  })

  it('refuses an unclosed quote, naming its line', async () => {
    const error = await refusal(() => parseRoster('email,name,roles,team\na@x.test,"Dr A,resident,\nb@x.test,Dr B,resident,\n'))

    expect(error).toMatchObject({ status: 400, code: 'roster-malformed' })
    expect(error.message).toContain('line 2')
  })

  it('refuses a header with no rows, and an empty file', async () => {
    expect(await refusal(() => parseRoster('email,name,roles,team\n\n\n'))).toMatchObject({ code: 'roster-no-rows' })
    expect(await refusal(() => parseRoster('\n  \n'))).toMatchObject({ code: 'roster-empty' })
  })
})

import { describe, expect, it } from 'vitest'
import Papa from 'papaparse'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { CSV_CAUTION, PAIR_CSV_COLUMNS, pairsCsv } from '@/components/agreement/pairs-csv'
import { makePair } from './make-agreement'

const parse = (csv: string) => Papa.parse<string[]>(csv, { skipEmptyLines: true }).data

describe('pairsCsv: the pairs CSV download', () => {
  it('starts with the documented header row and writes one row per pair', () => {
    const pairs = [makePair(3, 4, { patientCode: 'SM-0142' }), makePair(5.5, 4.5, { patientCode: 'SM-0204' })]

    const rows = parse(pairsCsv(pairs))

    expect(rows[0]).toEqual(PAIR_CSV_COLUMNS)
    expect(rows[0]!.slice(0, 6)).toEqual(['patient_code', 'difference_order', 'difference_cm', 'mean_cm', 'minutes_apart', 'first_exam_id'])
    expect(rows).toHaveLength(2 + 1 + 1)
    const row = Object.fromEntries(PAIR_CSV_COLUMNS.map((c, i) => [c, rows[1]![i]]))
    expect(row).toMatchObject({
      patient_code: 'SM-0142',
      difference_order: 'resident-minus-attending',
      difference_cm: '-1',
      mean_cm: '3.5',
      minutes_apart: '30',
      first_examiner: 'Dr Sam Whitcombe',
      first_role: 'resident',
      first_height_cm: '3',
      first_inclination_deg: '45',
      first_vein: 'right-internal',
      first_examined_at: '2026-03-14T09:00:00.000Z',
      second_examiner: 'Dr Tomas Lindqvist',
      second_role: 'attending',
      second_height_cm: '4',
    })
    expect(rows[2]![2]).toBe('1')
  })

  it('ends with the caution as its own row, in the first column, the other cells empty', () => {
    const rows = parse(pairsCsv([makePair(3, 4)]))

    const last = rows.at(-1)!
    expect(last[0]).toBe(`Caution: ${CAUTION_TEXT}`)
    expect(last[0]).toBe(CSV_CAUTION)
    expect(last.slice(1).every((cell) => cell === '')).toBe(true)
    expect(last).toHaveLength(PAIR_CSV_COLUMNS.length)
  })

  it('still carries the header and the caution when no pair matches', () => {
    const rows = parse(pairsCsv([]))

    expect(rows).toEqual([PAIR_CSV_COLUMNS, [CSV_CAUTION, ...new Array(PAIR_CSV_COLUMNS.length - 1).fill('')]])
  })

  it('quotes commas and quotes (RFC 4180), uses CRLF, and defuses cells a spreadsheet would run as formulas', () => {
    const pair = makePair(3, 4)
    pair.first.examinerName = 'Reed, "Rowan"'
    pair.second.examinerName = '=HYPERLINK("x")'

    const csv = pairsCsv([pair], (id) => (id === 't-ward' ? 'Ward 7 North — Cardiology' : id))

    expect(csv).toContain('"Reed, ""Rowan"""')
    expect(csv.split('\r\n')).toHaveLength(3)
    const row = parse(csv)[1]!
    expect(row[PAIR_CSV_COLUMNS.indexOf('second_examiner')]).toBe(`'=HYPERLINK("x")`)
    expect(row[PAIR_CSV_COLUMNS.indexOf('first_team')]).toBe('Ward 7 North — Cardiology')
    // Negative numbers stay numbers: only text is defused.
    expect(row[PAIR_CSV_COLUMNS.indexOf('difference_cm')]).toBe('-1')
  })

  it('defuses a formula cell that goes on after a line break (OWASP, "CSV Injection")', () => {
    const pair = makePair(3, 4)
    pair.first.examinerName = '@SUM(1)\n=cmd'

    const row = parse(pairsCsv([pair]))[1]!

    expect(row[PAIR_CSV_COLUMNS.indexOf('first_examiner')]).toBe(`'@SUM(1)\n=cmd`)
  })
})

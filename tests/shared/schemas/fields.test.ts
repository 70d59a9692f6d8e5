import { describe, expect, it } from 'vitest'
import { ExamInputSchema, ExamListQuerySchema } from '#shared/schemas/exam'
import { clientTime, idField, lineField, textField, uuidField } from '#shared/schemas/fields'

describe('uuidField', () => {
  it('reads a UUID in upper case as its lower-case spelling', () => {
    expect(uuidField('Send a UUID').parse('3F2504E0-4F89-41D3-9A0C-0305E82C3301')).toBe('3f2504e0-4f89-41d3-9a0c-0305e82c3301')
  })

  it('refuses text that is not a UUID with the given message', () => {
    expect(uuidField('Send a UUID').safeParse('a\u0000b').error?.issues[0]?.message).toBe('Send a UUID')
  })
})

describe('idField', () => {
  it('lower-cases a UUID and keeps any other id as sent', () => {
    const id = idField('Choose a team')

    expect(id.parse('3F2504E0-4F89-41D3-9A0C-0305E82C3301')).toBe('3f2504e0-4f89-41d3-9a0c-0305e82c3301')
    expect(id.parse('Ward-7')).toBe('Ward-7')
  })

  it.each(['', 'a\u0000b', 'tab\there', 'x'.repeat(65)])('refuses %j', (value) => {
    expect(idField('Choose a team').safeParse(value).success).toBe(false)
  })
})

describe('lineField and textField', () => {
  it('a one-line value refuses any control character', () => {
    expect(lineField(40).safeParse('SM\u00000142').success).toBe(false)
    expect(lineField(40).safeParse('SM\t0142').success).toBe(false)
  })

  it('free text keeps tabs and line breaks and refuses other control characters', () => {
    expect(textField(100, 'Too long').parse('a\tb\r\nc')).toBe('a\tb\r\nc')
    expect(textField(100, 'Too long').safeParse('a\u0000b').success).toBe(false)
    expect(textField(100, 'Too long').safeParse('a\u001bb').success).toBe(false)
  })
})

describe('clientTime', () => {
  it.each(['1900-01-01T00:00:00Z', '2026-12-03T11:46:00+01:00', '2100-12-31T23:59:59Z'])('accepts %s', (value) => {
    expect(clientTime('Enter a time').parse(value)).toBe(value)
  })

  it.each(['0000-01-01T00:00:00Z', '0099-12-31T23:59:59Z', '1899-12-31T23:59:59Z', '2101-01-01T00:00:00Z'])(
    'refuses %s with the range in the message',
    (value) => {
      expect(clientTime('Enter a time').safeParse(value).error?.issues[0]?.message).toBe('Use a date between 1900 and 2100')
    },
  )
})

describe('the exam schemas with these fields', () => {
  it('ExamInputSchema names each field holding a control character', () => {
    const result = ExamInputSchema.safeParse({ teamId: 't\u0000', roundId: 'r\u0000', notes: 'n\u0000' })

    const paths = result.error?.issues.filter((i) => /control/.test(i.message)).map((i) => i.path.join('.'))
    expect(paths?.sort()).toEqual(['notes', 'roundId', 'teamId'])
  })

  it('ExamInputSchema refuses venous signs that are not text, without throwing', () => {
    expect(() => ExamInputSchema.safeParse({ venousSigns: [{ toString: 1 }, { valueOf: {} }] })).not.toThrow()
    expect(ExamInputSchema.safeParse({ venousSigns: [{ toString: 1 }] }).error?.issues.map((i) => i.path[0])).toContain('venousSigns')
  })

  it('ExamListQuerySchema refuses a NUL in the patient code filter and lower-cases a team UUID', () => {
    expect(ExamListQuerySchema.safeParse({ patientCode: 'SM\u0000' }).success).toBe(false)
    expect(ExamListQuerySchema.parse({ teamId: 'AB2504E0-4F89-41D3-9A0C-0305E82C3301' }).teamId).toBe(
      'ab2504e0-4f89-41d3-9a0c-0305e82c3301',
    )
  })
})

import { describe, expect, it } from 'vitest'
import { actionLabel, changeLines } from '@/utils/audit-format'

describe('changeLines', () => {
  it('shows a changed field as before → after', () => {
    const lines = changeLines({ heightCm: { from: 4, to: 5.5 }, status: { from: 'submitted', to: 'countersigned' } })

    expect(lines).toEqual([
      { field: 'heightCm', from: '4', to: '5.5' },
      { field: 'status', from: 'submitted', to: 'countersigned' },
    ])
  })

  it('shows an empty before as a dash and a list as words', () => {
    const lines = changeLines({ venousSigns: { from: null, to: ['double-peaked', 'not-palpable'] } })

    expect(lines).toEqual([{ field: 'venousSigns', from: '—', to: 'double-peaked, not-palpable' }])
  })

  it('shows a detail that is not a change as its value alone', () => {
    const lines = changeLines({ reason: 'wrong-password' })

    expect(lines).toEqual([{ field: 'reason', to: 'wrong-password' }])
  })

  it('shortens a long value such as a hash', () => {
    const [line] = changeLines({ signature: { from: null, to: { hash: 'f'.repeat(64), meaning: 'reviewed-agree' } } })

    expect(line!.to.length).toBeLessThanOrEqual(80)
    expect(line!.to.endsWith('…')).toBe(true)
  })

  it('has no lines for an event without changes', () => {
    expect(changeLines(null)).toEqual([])
  })
})

describe('actionLabel', () => {
  it('words known actions and shows unknown ones as stored', () => {
    expect(actionLabel('exam-countersign')).toBe('Countersigned')
    expect(actionLabel('export-csv')).toBe('export-csv')
  })
})

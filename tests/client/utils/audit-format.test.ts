import { describe, expect, it } from 'vitest'
import { actionLabel, changeLines, entityLabel, isCreation, rawChangeLines, wordsFromTeams } from '@/utils/audit-format'
import { formatDateTime } from '@/utils/format'

const names = wordsFromTeams([
  { id: 'team-7n', name: 'Ward 7 North' },
  { id: 'team-icu', name: 'Intensive care' },
])

describe('changeLines', () => {
  it('labels fields as the form does and gives lengths, pressures and angles with their units', () => {
    const lines = changeLines({
      heightCm: { from: 4, to: 5.5 },
      cvpCmH2O: { from: 13.7, to: 15.2 },
      inclinationDeg: { from: 30, to: 45 },
    })

    expect(lines).toEqual([
      { field: 'Above the sternal angle', from: '4.0 cm', to: '5.5 cm' },
      { field: 'CVP estimate', from: '13.7 cmH₂O', to: '15.2 cmH₂O' },
      { field: 'Inclination', from: '30° from horizontal', to: '45° from horizontal' },
    ])
  })

  it('names teams instead of showing their ids, and says when a team is not one the reader can see', () => {
    const lines = changeLines(
      { teamId: { from: 'team-7n', to: 'team-icu' }, teamIds: { from: ['team-7n'], to: ['team-7n', 'team-x'] } },
      names,
    )

    expect(lines).toEqual([
      { field: 'Team', from: 'Ward 7 North', to: 'Intensive care' },
      { field: 'Teams', from: 'Ward 7 North', to: 'Ward 7 North, a team not shown to you' },
    ])
  })

  it('words the abdominojugular test as the findings do', () => {
    const lines = changeLines({
      abdominojugular: { from: { done: false }, to: { done: true, riseCm: 0 } },
      status: { from: 'draft', to: 'submitted' },
    })

    expect(lines).toEqual([
      { field: 'Abdominojugular test', from: 'Not done', to: 'Done, no rise' },
      { field: 'Status', from: 'Draft', to: 'Submitted' },
    ])
  })

  it('gives one line per venous sign whose state changed, as present, absent or not tested', () => {
    const lines = changeLines({
      venousSigns: {
        from: { 'double-peaked': 'present', 'not-palpable': 'not-tested' },
        to: { 'double-peaked': 'absent', 'not-palpable': 'present' },
      },
    })

    expect(lines).toEqual([
      { field: 'Not palpable', from: 'not tested', to: 'present' },
      { field: 'Double-peaked', from: 'present', to: 'absent' },
    ])
  })

  it("reads the older list of present signs, and leaves out a new record's untested signs", () => {
    const lines = changeLines({ venousSigns: { from: null, to: ['double-peaked'] } })

    expect(lines).toEqual([{ field: 'Double-peaked', from: 'not tested', to: 'present' }])
  })

  it('splits the waveform into its a wave, v wave and y descent', () => {
    const lines = changeLines({ waveform: { from: { aWave: 'unclear', vWave: 'normal' }, to: { aWave: 'cannon', vWave: 'normal' } } })

    expect(lines).toEqual([{ field: 'a wave', from: 'Unclear', to: 'Cannon' }])
  })

  it("writes times in the app's one format", () => {
    const [line] = changeLines({ examinedAt: { from: '2026-03-14T09:30:00Z', to: '2026-03-14T10:00:00Z' } })

    expect(line).toEqual({ field: 'Examined', from: formatDateTime('2026-03-14T09:30:00Z'), to: formatDateTime('2026-03-14T10:00:00Z') })
    expect(line!.to).not.toContain('T10:00')
  })

  it('writes a stored time of any other field in the same format', () => {
    const [line] = changeLines({ closedAt: { from: null, to: '2026-12-03T12:57:36.052Z' } })

    expect(line).toEqual({ field: 'Closed at', from: '—', to: formatDateTime('2026-12-03T12:57:36.052Z') })
  })

  it('marks ids, hashes and version counters as details', () => {
    const lines = changeLines({ attachmentId: 'att-9', sha256: 'f'.repeat(64), version: { from: 1, to: 2 }, consentConfirmed: true })

    expect(lines.filter((line) => line.detail).map((line) => line.field)).toEqual(['Photo id', 'SHA-256', 'Version'])
    expect(lines.find((line) => !line.detail)).toEqual({ field: 'Consent confirmed', to: 'Yes' })
  })

  it('shows an empty value as a dash, a failure detail in words, a setting as the settings screen labels it, and an unknown field readably', () => {
    const lines = changeLines({
      notes: { from: '', to: 'Rechecked' },
      reason: 'wrong-password',
      'estimate.lowBelowCmH2O': { from: 5, to: 4 },
      revisedBy: 'x',
    })

    expect(lines).toEqual([
      { field: 'Notes', from: '—', to: 'Rechecked' },
      { field: 'Reason', to: 'Wrong password' },
      { field: 'Low CVP below', from: '5 cmH₂O', to: '4 cmH₂O' },
      { field: 'Revised by', to: 'x' },
    ])
  })

  it('for a new record, lists the values it was made with, without a "before" and without empty fields', () => {
    const lines = changeLines(
      { patientCode: { from: null, to: 'SM-0142' }, notes: { from: null, to: '' }, heightCm: { from: null, to: 4 } },
      names,
      true,
    )

    expect(lines).toEqual([
      { field: 'Patient code', to: 'SM-0142' },
      { field: 'Above the sternal angle', to: '4.0 cm' },
    ])
  })

  it('has no lines for an event without changes', () => {
    expect(changeLines(null)).toEqual([])
  })
})

describe('rawChangeLines', () => {
  it('shows the stored keys and values, shortening a long value such as a hash', () => {
    const lines = rawChangeLines({
      teamId: { from: 'team-7n', to: 'team-icu' },
      signature: { from: null, to: { hash: 'f'.repeat(64), meaning: 'reviewed-agree' } },
    })

    expect(lines[0]).toEqual({ field: 'teamId', from: 'team-7n', to: 'team-icu' })
    expect(lines[1]!.to.length).toBeLessThanOrEqual(80)
    expect(lines[1]!.to.endsWith('…')).toBe(true)
  })
})

describe('actionLabel and entityLabel', () => {
  it('word known actions and kinds of record, and show unknown ones as stored', () => {
    expect(actionLabel('exam-countersign')).toBe('Countersigned')
    expect(actionLabel('export-csv')).toBe('export-csv')
    expect(entityLabel('user')).toBe('Account')
    expect(entityLabel(null)).toBe('')
    expect([isCreation('exam-create'), isCreation('exam-update')]).toEqual([true, false])
  })
})

import type { RoundDetail, RoundResults } from '#shared/schemas/round'
import { CAUTION_TEXT } from '#shared/domain/interpretation'

const examiners = [
  { id: 'ex-1', displayName: 'Dr Sam Whitcombe' },
  { id: 'ex-2', displayName: 'Dr Aiko Brennan' },
]

/** A round of two codes and two examiners; entries as given (all missing by default). */
export function makeRound(overrides: Partial<RoundDetail> = {}): RoundDetail {
  const patientCodes = overrides.patientCodes ?? ['SM-0311', 'SM-0312']
  return {
    id: 'round-1',
    name: 'Ward 7 North calibration',
    status: 'open',
    createdBy: { id: 'edu-1', displayName: 'Dr Hana Okafor' },
    createdAt: '2026-11-20T09:00:00.000Z',
    closedAt: null,
    patientCodes,
    examiners,
    recorded: 0,
    expected: patientCodes.length * examiners.length,
    codesMasked: false,
    entries: patientCodes.flatMap((patientCode) =>
      examiners.map((e) => ({ examinerId: e.id, patientCode, state: 'missing' as const, examId: null, heightCm: null })),
    ),
    canClose: false,
    isExaminer: false,
    ...overrides,
  }
}

export function makeResults(overrides: Partial<RoundResults> = {}): RoundResults {
  return {
    roundId: 'round-1',
    name: 'Ward 7 North calibration',
    closedAt: '2026-11-25T09:00:00.000Z',
    subjects: 2,
    raters: 2,
    completeSubjects: 1,
    incompleteCodes: ['SM-0312'],
    missing: { count: 1, entries: [{ examinerId: 'ex-2', examinerName: 'Dr Aiko Brennan', patientCode: 'SM-0312', reason: 'not-recorded' }] },
    icc: { value: 0.7123, ci: [0.2345, 0.9512] },
    fleissElevated: { value: 0.4615, label: 'moderate' },
    elevatedAboveCm: 3,
    byExaminer: [
      { examinerId: 'ex-1', name: 'Dr Sam Whitcombe', n: 5, bias: -0.84, sd: 0.52 },
      { examinerId: 'ex-2', name: 'Dr Aiko Brennan', n: 5, bias: 0.84, sd: 0.52 },
    ],
    patientCodes: ['SM-0311', 'SM-0312'],
    examiners,
    heights: [
      [2, 3],
      [4, null],
    ],
    codesMasked: false,
    caution: CAUTION_TEXT,
    ...overrides,
  }
}

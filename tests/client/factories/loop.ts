import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { mmHgToCmH2O } from '#shared/domain/units'
import type { AccuracyPoint, AccuracySummary, Reference } from '#shared/schemas/reference'
import type { MyAgreement } from '#shared/schemas/learning'

/** A stored reference as the API returns it: a central-line CVP of 12 mmHg unless overridden. */
export function makeReference(overrides: Partial<Reference> = {}): Reference {
  const value = overrides.value ?? 12
  const unit = overrides.unit ?? 'mmHg'
  return {
    id: 'ref-1',
    examId: 'exam-1',
    kind: 'central-line',
    value,
    unit,
    valueCmH2O: unit === 'mmHg' ? mmHgToCmH2O(value) : value,
    measuredAt: '2026-03-14T09:40:00.000Z',
    addedById: 'u-1',
    addedByName: 'Dr Sam Whitcombe',
    addedAt: '2026-03-14T09:45:00.000Z',
    paired: true,
    ...overrides,
  }
}

export function makeAccuracyPoint(estimateCmH2O: number, referenceCmH2O: number, overrides: Partial<AccuracyPoint> = {}): AccuracyPoint {
  return { examId: `e-${estimateCmH2O}-${referenceCmH2O}`, kind: 'central-line', estimateCmH2O, referenceCmH2O, bound: 'point', band: [estimateCmH2O - 4, estimateCmH2O + 4], inside: Math.abs(estimateCmH2O - referenceCmH2O) <= 4, ...overrides }
}

/** The accuracy summary of `points`; bias and limits as given (the server computes them). */
export function makeAccuracy(overrides: Partial<AccuracySummary> = {}): AccuracySummary {
  return {
    n: 50,
    bias: 1.2,
    sd: 2.5,
    loa: [-3.7, 6.1],
    // 41 of 50: Wilson 95% interval 0.692–0.902 (Wilson 1927, JASA 22:209–212, by hand with z = 1.96).
    coverage: { inside: 41, n: 50, share: 0.82, ci: [0.692, 0.902] },
    points: [makeAccuracyPoint(10, 8), makeAccuracyPoint(14, 7.5), makeAccuracyPoint(6, 7)],
    caution: CAUTION_TEXT,
    ...overrides,
  }
}

export function makeMyAgreement(overrides: Partial<MyAgreement> = {}): MyAgreement {
  return {
    residentId: 'u-1',
    name: 'Dr Sam Whitcombe',
    n: 23,
    bias: 1.4,
    meanAbsDifference: 2.3,
    curve: [
      { block: 1, fromCase: 1, toCase: 10, n: 10, meanAbsDifferenceCmH2O: 3.1 },
      { block: 2, fromCase: 11, toCase: 20, n: 10, meanAbsDifferenceCmH2O: 1.9 },
      { block: 3, fromCase: 21, toCase: 23, n: 3, meanAbsDifferenceCmH2O: 1.2 },
    ],
    feedback: [
      {
        examId: 'exam-7',
        patientCode: 'SM-0142',
        signerName: 'Dr Tomas Lindqvist',
        signedAt: '2026-03-14T11:00:00.000Z',
        codes: ['read-peak-not-mean', 'other'],
        text: 'Use the bed lever, not pillows.',
        differenceCmH2O: 2.6,
      },
    ],
    caution: CAUTION_TEXT,
    ...overrides,
  }
}

import type { AgreementPair, AgreementSummary, AgreementTrend, PairReading } from '#shared/schemas/agreement'

let examSeq = 0

function reading(overrides: Partial<PairReading>): PairReading {
  return {
    examId: `exam-${++examSeq}`,
    examinerId: 'u-res',
    examinerName: 'Dr Sam Whitcombe',
    role: 'resident',
    teamId: 't-ward',
    examinedAt: '2026-03-14T09:00:00.000Z',
    heightCm: 3,
    inclinationDeg: 45,
    vein: 'right-internal',
    category: 'high',
    elevated: false,
    ...overrides,
  }
}

/** A resident–attending pair: first is the resident's reading, second the attending's. */
export function makePair(residentCm: number, attendingCm: number, overrides: Partial<AgreementPair> = {}): AgreementPair {
  return {
    patientCode: 'SM-0142',
    order: 'resident-minus-attending',
    differenceCm: residentCm - attendingCm,
    meanCm: (residentCm + attendingCm) / 2,
    minutesApart: 30,
    first: reading({ heightCm: residentCm }),
    second: reading({
      heightCm: attendingCm,
      examinerId: 'u-att',
      examinerName: 'Dr Tomas Lindqvist',
      role: 'attending',
      examinedAt: '2026-03-14T09:30:00.000Z',
    }),
    ...overrides,
  }
}

/**
 * The summary of the pairs (3,4), (2,4), (5,4.5), (1,2), worked by hand with Bland & Altman 1986's formulas:
 * differences −1, −2, +0.5, −1 → bias −0.875, SD 1.0308; the CIs use t(0.975, 3) = 3.182446.
 */
export const HAND_PAIRS: [number, number][] = [
  [3, 4],
  [2, 4],
  [5, 4.5],
  [1, 2],
]

export function makeSummary(overrides: Partial<AgreementSummary> = {}): AgreementSummary {
  const sd = 1.0307764064
  const bias = -0.875
  return {
    n: 4,
    blandAltman: {
      bias,
      sd,
      loa: [bias - 1.96 * sd, bias + 1.96 * sd],
      biasCi: [bias - 3.182446 * (sd / 2), bias + 3.182446 * (sd / 2)],
      loaCi: { lower: [-4.97, -0.08], upper: [-1.67, 3.22] },
    },
    icc: { value: 0.78, ci: [-0.05, 0.98] },
    kappaElevated: { value: 0.5, label: 'moderate' },
    kappaCategory: { linear: 0.62, quadratic: 0.71, label: 'substantial' },
    byExaminer: [
      { examinerId: 'u-res', name: 'Dr Sam Whitcombe', role: 'resident', n: 4, bias, sd, loa: [bias - 1.96 * sd, bias + 1.96 * sd] },
      {
        examinerId: 'u-att',
        name: 'Dr Tomas Lindqvist',
        role: 'attending',
        n: 4,
        bias: -bias,
        sd,
        loa: [-bias - 1.96 * sd, -bias + 1.96 * sd],
      },
    ],
    ...overrides,
  }
}

export function makeTrend(): AgreementTrend {
  return {
    months: [
      { month: '2026-01', n: 2, bias: -1.5, sd: 0.7071, loa: [-2.886, -0.114] },
      { month: '2026-02', n: 0, bias: null, sd: null, loa: null },
      { month: '2026-03', n: 1, bias: 0.5, sd: null, loa: null },
    ],
  }
}

export const UNAVAILABLE = { unavailable: 'Needs at least 2 pairs; only 1 matches' }

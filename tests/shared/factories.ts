import { ExamFindingsSchema, type ExamFindings, type ExamFindingsInput, type ObserverTerm } from '#shared/schemas/exam'

/** Findings parsed like the API does, so every default applies; a vertical 4 cm reading at 45° unless overridden. */
export function makeFindings(overrides: Partial<ExamFindingsInput> = {}): ExamFindings {
  return ExamFindingsSchema.parse({
    inclinationDeg: 45,
    vein: 'right-internal',
    columnTop: 'seen',
    heightMethod: 'vertical',
    heightCm: 4,
    readingPrecision: 'ruler',
    offsetModel: 'incline-adjusted',
    ...overrides,
  })
}

/** A local error term as the server would hand it over: σ_exam from 40 routine pairs unless overridden. */
export function makeLocalTerm(overrides: Partial<ObserverTerm> = {}): ObserverTerm {
  return { source: 'local-pairs', sigmaCm: 1.2, n: 40, ci: [1.0, 1.5], ...overrides }
}

/** A raw create-exam body, as a client would send it. */
export function makeExamBody(overrides: Record<string, unknown> = {}): Record<string, unknown> {
  return {
    id: '0b7f1c2e-3d4a-4b5c-8d6e-7f8091a2b3c4',
    patientCode: 'SM-0142',
    teamId: 'team-ward-7-north',
    examinedAt: '2026-03-02T09:30:00+00:00',
    inclinationDeg: 45,
    vein: 'right-internal',
    columnTop: 'seen',
    heightCm: 4,
    ...overrides,
  }
}

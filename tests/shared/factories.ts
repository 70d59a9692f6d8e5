import { ExamFindingsSchema, type ExamFindings, type ExamFindingsInput } from '#shared/schemas/exam'

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

import { computeEstimate } from '#shared/domain/estimate'
import { ExamFindingsSchema, ExamSchema, type Exam, type ExamFindingsInput } from '#shared/schemas/exam'
import { WORKED_EXAMPLE_FINDINGS } from './worked-example.ts'

let serial = 0

type ExamOverrides = Partial<Omit<Exam, 'estimate' | 'venousSigns'>> & { venousSigns?: ExamFindingsInput['venousSigns'] }

/** An ExamSchema-valid exam as the API returns it: the worked example (h = 4 cm at 45°, ruler) unless overridden. */
export function makeApiExam(overrides: ExamOverrides = {}): Exam {
  serial += 1
  const fields = {
    id: `0b6b4a52-5d4e-4f7e-9d57-${String(serial).padStart(12, '0')}`,
    patientCode: 'SM-0142',
    teamId: 't-1',
    teamName: 'Ward 7 North — Cardiology',
    examinerId: 'u-1',
    examinerName: 'Dr Sam Whitcombe',
    examinedAt: '2026-03-14T09:30:00.000Z',
    notes: '',
    ...WORKED_EXAMPLE_FINDINGS,
    status: 'draft',
    version: 1,
    createdAt: '2026-03-14T09:35:00.000Z',
    updatedAt: '2026-03-14T09:35:00.000Z',
    submittedAt: null,
    ...overrides,
  }
  return ExamSchema.parse({ ...fields, estimate: computeEstimate(ExamFindingsSchema.parse(fields)) })
}

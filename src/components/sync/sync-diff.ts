import { ExamInputSchema, type Exam, type ExamInput } from '#shared/schemas/exam'
import { formatDateTime } from '@/utils/format'

// The band reviewed is what the examiner saw, not a finding of the record: it is never compared.
type Field = Exclude<keyof ExamInput, 'id' | 'reviewed'>

const LABELS: Record<Field, string> = {
  patientCode: 'Patient code',
  teamId: 'Team',
  examinedAt: 'Examined at',
  inclinationDeg: 'Inclination (°)',
  inclinationSource: 'Inclination from',
  vein: 'Vein',
  columnTop: 'Column top',
  heightMethod: 'Height measured',
  heightCm: 'Height above the sternal angle (cm)',
  alongNeckCm: 'Distance along the neck (cm)',
  readingPrecision: 'Reading',
  offsetModel: 'Offset model',
  venousSigns: 'Venous signs',
  venousConfirmed: 'Column confirmed venous',
  rhythm: 'Rhythm',
  waveform: 'Waveform',
  respiratory: 'With respiration',
  abdominojugular: 'Abdominojugular test',
  notAssessableReason: 'Why not assessable',
  notAssessableText: 'Reason (other)',
  context: 'Circumstances',
  notes: 'Notes',
  roundId: 'Calibration round',
}

/** One field as each side has it, in words. */
export interface FieldDiff {
  field: Field
  label: string
  mine: string
  theirs: string
}

function show(field: Field, value: unknown): string {
  if (value === null || value === undefined || value === '') return '—'
  if (field === 'examinedAt') return formatDateTime(String(value))
  if (Array.isArray(value)) return value.length ? [...value].sort().join(', ') : '—'
  if (typeof value === 'object') return Object.entries(value).map(([key, v]) => `${key}: ${v}`).join(', ')
  return String(value)
}

/** The record fields on which the local version and the server's differ, in the order the exam is recorded. */
export function differingFields(mine: ExamInput, theirs: Exam): FieldDiff[] {
  const server = ExamInputSchema.safeParse(theirs)
  const other = (server.success ? server.data : theirs) as Record<Field, unknown>
  return (Object.keys(LABELS) as Field[])
    .map((field) => ({ field, label: LABELS[field], mine: show(field, mine[field]), theirs: show(field, other[field]) }))
    .filter((diff) => diff.mine !== diff.theirs)
}

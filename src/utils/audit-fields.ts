import { MEANING_LABEL } from '#shared/domain/signature-text'
import { STATUS_LABEL, oneDp } from '#shared/domain/exam-note'
import { AbdominojugularSchema } from '#shared/schemas/exam'
import { CONTEXT_LABELS } from '@/components/exam/exam-format'
import { ROLE_LABEL } from '@/components/accounts/account-text'
import { OFFSET_MODEL_CHOICES, SETTING_GROUPS } from '@/components/settings/settings-fields'
import { formatDateTime } from './format'
import { COLUMN_TOP_WORDS, NOT_ASSESSABLE_WORDS, RESPIRATORY_WORDS, abdominojugularWords, capitalise, veinWords } from './exam-words'

/** What the words need from elsewhere: the names of teams, which events store by id. */
export interface AuditWords {
  teamName: (id: string) => string | undefined
}

export interface FieldSpec {
  label: string
  words?: (value: unknown, names: AuditWords) => string
  /** A raw id, hash or counter: shown only among an admin's details. */
  detail?: true
}

const from = (table: Record<string, string>) => (value: unknown) => table[String(value)] ?? String(value)
const unit = (suffix: string) => (value: unknown) => (typeof value === 'number' ? `${oneDp(value)} ${suffix}` : String(value))
const yesNo = (value: unknown) => (value ? 'Yes' : 'No')
const time = (value: unknown) => formatDateTime(String(value))
const list = (words: (item: string) => string) => (value: unknown) =>
  Array.isArray(value) ? value.map((item) => words(String(item))).join(', ') || 'None' : words(String(value))

function teamWords(id: string, names: AuditWords): string {
  return names.teamName(id) ?? 'a team not shown to you'
}

function signatureWords(value: unknown): string {
  const s = value as { meaning?: string; examVersion?: number }
  const meaning = MEANING_LABEL[s.meaning as keyof typeof MEANING_LABEL] ?? s.meaning
  return `${meaning}${s.examVersion ? ` (version ${s.examVersion})` : ''}`
}

/** A settings change is stored by the setting's path, as the settings screen labels it. */
const SETTING_SPECS: Record<string, FieldSpec> = Object.fromEntries([
  ...SETTING_GROUPS.flatMap((group) => group.fields).map((f) => [
    f.path,
    { label: f.label, words: (v: unknown) => `${String(v)} ${f.unit}` },
  ]),
  [
    'defaultOffsetModel',
    { label: 'Default offset model', words: from(Object.fromEntries(OFFSET_MODEL_CHOICES.map((c) => [c.value, c.title]))) },
  ],
  ['photosAllowed', { label: 'Photos allowed', words: yesNo }],
])

/** Each stored field as the form and the findings name it; the record's own keys stay behind the admin's details. */
export const FIELD_SPECS: Record<string, FieldSpec> = {
  patientCode: { label: 'Patient code' },
  teamId: { label: 'Team', words: (v, names) => teamWords(String(v), names) },
  teamIds: { label: 'Teams', words: (v, names) => list((id) => teamWords(id, names))(v) },
  examinedAt: { label: 'Examined', words: time },
  submittedAt: { label: 'Submitted', words: time },
  inclinationDeg: { label: 'Inclination', words: (v) => `${String(v)}° from horizontal` },
  inclinationSource: { label: 'Inclination from', words: from({ sensor: 'Measured by phone', entered: 'Entered' }) },
  vein: { label: 'Vein', words: (v) => veinWords(String(v)) },
  columnTop: { label: 'Column top', words: from(COLUMN_TOP_WORDS) },
  heightMethod: { label: 'Method', words: from({ vertical: 'Vertical rule at the sternal angle', 'along-neck': 'Along the neck' }) },
  heightCm: { label: 'Above the sternal angle', words: unit('cm') },
  alongNeckCm: { label: 'Along the neck', words: unit('cm') },
  readingPrecision: { label: 'Reading', words: from({ ruler: 'With a ruler', visual: 'By eye' }) },
  offsetModel: { label: 'Offset model', words: from({ 'incline-adjusted': 'Incline-adjusted', 'fixed-5cm': 'Fixed 5 cm' }) },
  venousConfirmed: { label: 'Column confirmed venous', words: yesNo },
  rhythm: { label: 'Rhythm', words: (v) => capitalise(String(v)) },
  respiratory: { label: 'Respiration', words: from(RESPIRATORY_WORDS) },
  abdominojugular: {
    label: 'Abdominojugular test',
    words: (v) => {
      const parsed = AbdominojugularSchema.safeParse(v)
      return parsed.success ? abdominojugularWords(parsed.data) : String(v)
    },
  },
  notAssessableReason: { label: 'Reason not assessable', words: from(NOT_ASSESSABLE_WORDS) },
  notAssessableText: { label: 'Reason in words' },
  context: { label: 'Circumstances', words: list(from(CONTEXT_LABELS)) },
  notes: { label: 'Notes' },
  status: { label: 'Status', words: from(STATUS_LABEL) },
  cvpCmH2O: { label: 'CVP estimate', words: unit('cmH₂O') },
  returnComment: { label: 'Return comment' },
  signature: { label: 'Countersignature', words: signatureWords },
  reason: { label: 'Reason', words: from({ 'wrong-password': 'Wrong password' }) },
  mimeType: { label: 'Photo type', words: from({ 'image/jpeg': 'JPEG', 'image/png': 'PNG', 'image/webp': 'WebP' }) },
  byteSize: { label: 'Photo size', words: (v) => `${Math.max(1, Math.round(Number(v) / 1024))} KB` },
  consentConfirmed: { label: 'Consent confirmed', words: yesNo },
  email: { label: 'E-mail' },
  displayName: { label: 'Display name' },
  roles: { label: 'Roles', words: list(from(ROLE_LABEL)) },
  revokedSessions: { label: 'Sessions ended' },
  version: { label: 'Version', detail: true },
  roundId: { label: 'Calibration round', detail: true },
  attachmentId: { label: 'Photo id', detail: true },
  sha256: { label: 'SHA-256', detail: true },
  ...SETTING_SPECS,
}

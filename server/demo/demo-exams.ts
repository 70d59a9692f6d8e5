import { createHash } from 'node:crypto'
import { ExamInputSchema, type ExamInputRaw } from '#shared/schemas/exam'
import { createExam, submitExam } from '../exams/exams.service.ts'
import { ExamModel, UserModel } from '../models/index.ts'
import { getUser } from '../users/users.service.ts'
import { VENOUS_SIGNS_SEEN } from './demo-signs.ts'

type Findings = Omit<ExamInputRaw, 'id' | 'teamId' | 'examinedAt'>

interface DemoExam {
  key: string
  author: string
  team: string
  hoursAgo: number
  submit: boolean
  findings: Findings
}

const WARD = 'Ward 7 North — Cardiology'
const AMU = 'Acute Medical Unit'
const ICU = 'Medical ICU'
const VENOUS = VENOUS_SIGNS_SEEN
// In atrial fibrillation a single-peaked pulsation is expected, so the absent double peak does not count against the vein.
const AF_TR = {
  rhythm: 'atrial-fibrillation',
  waveform: { aWave: 'absent', vWave: 'large', yDescent: 'normal' },
  venousSigns: { ...VENOUS, 'double-peaked': 'absent' },
} as const

function seen(patientCode: string, inclinationDeg: number, heightCm: number | null, more: Partial<Findings> = {}): Findings {
  return {
    patientCode,
    inclinationDeg,
    heightCm,
    vein: 'right-internal',
    columnTop: 'seen',
    readingPrecision: 'ruler',
    venousSigns: VENOUS,
    rhythm: 'sinus',
    respiratory: 'falls-on-inspiration',
    ...more,
  }
}

const exam = (key: string, author: string, team: string, hoursAgo: number, submit: boolean, findings: Findings): DemoExam => ({
  key,
  author,
  team,
  hoursAgo,
  submit,
  findings,
})

// Invented patients. Pairs (one patient, two examiners, within the hour) feed the agreement views.
const EXAMS: DemoExam[] = [
  exam('sw-0142-a', 'resident', WARD, 50, true, seen('SM-0142', 45, 4, { notes: 'Clear double wave with the head turned slightly left.' })),
  exam('tl-0142-a', 'attending', WARD, 49.2, true, seen('SM-0142', 45, 3.5)),
  exam('sw-0157-a', 'resident', WARD, 30, true, seen('SM-0157', 30, 6, { ...AF_TR, notes: 'Large v waves; severe TR on last echo.' })),
  exam('ab-0157-a', 'resident2', WARD, 29.6, true, seen('SM-0157', 30, 5, { ...AF_TR, readingPrecision: 'visual' })),
  exam('tl-0157-a', 'attending', WARD, 29.3, true, seen('SM-0157', 30, 7, AF_TR)),
  exam(
    'sw-0163-a',
    'resident',
    WARD,
    26,
    true,
    seen('SM-0163', 60, 8, {
      columnTop: 'above-neck',
      respiratory: 'rises-on-inspiration',
      venousSigns: { ...VENOUS, 'falls-on-inspiration': 'absent' },
      waveform: { aWave: 'normal', vWave: 'normal', yDescent: 'steep' },
      context: ['svc-obstruction-suspected'],
      notes: 'Top of the column above the jaw even sitting upright; facial fullness, SVC obstruction to exclude.',
    }),
  ),
  exam(
    'sw-0171-a',
    'resident',
    WARD,
    20,
    true,
    seen('SM-0171', 45, -2, {
      readingPrecision: 'visual',
      venousSigns: { 'double-peaked': 'present', 'falls-on-inspiration': 'present', 'changes-with-position': 'present' },
    }),
  ),
  exam('la-0204-a', 'resident3', AMU, 12, true, seen('SM-0204', 35, 0, { context: ['positive-pressure-ventilation'], notes: 'On CPAP 8 cmH2O.' })),
  exam('la-0212-a', 'resident3', AMU, 10, true, seen('SM-0212', 45, 5, { context: ['tense-ascites'] })),
  exam(
    'nf-0220-a',
    'resident5',
    ICU,
    9,
    true,
    seen('SM-0220', 30, null, {
      columnTop: 'not-assessable',
      notAssessableReason: 'lines-or-dressings',
      venousSigns: {},
      context: ['positive-pressure-ventilation'],
      notes: 'Right internal jugular line and dressing; left neck obscured by the ventilator tubing.',
    }),
  ),
  exam('sw-0178-a', 'resident', WARD, 8, false, seen('SM-0178', 30, null, { heightMethod: 'along-neck', alongNeckCm: 6 })),
  exam('sw-0184-a', 'resident', WARD, 5, false, seen('SM-0184', 45, 2, { abdominojugular: { done: true, riseCm: 5, sustained: true } })),
  exam('sw-0142-b', 'resident', WARD, 3, false, seen('SM-0142', 45, 1, { notes: 'After two days of diuresis.' })),
  exam('sw-0190-a', 'resident', WARD, 1, false, seen('SM-0190', 0, null, { columnTop: 'not-filled', venousSigns: {} })),
  exam(
    'sw-0196-a',
    'resident',
    WARD,
    6,
    true,
    seen('SM-0196', 45, 6, {
      venousSigns: { ...VENOUS, 'not-palpable': 'absent', 'changes-with-position': 'present' },
      venousConfirmed: true,
      notes: 'A pulsation could be felt, but the column fell on inspiration and with sitting up: confirmed venous, carotid felt separately.',
    }),
  ),
]

/** A fixed UUID (version 8, RFC 9562) per demo exam, so reseeding finds the ones already made. */
function demoId(key: string): string {
  const hex = createHash('sha256').update(`plumbline-demo-exam/${key}`).digest('hex')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-8${hex.slice(13, 16)}-a${hex.slice(17, 20)}-${hex.slice(20, 32)}`
}

/** Records the demo exams that are missing, through the same service as the API (estimate, audit trail). */
export async function seedDemoExams(teamIds: Map<string, string>, now = new Date()): Promise<number> {
  let created = 0
  for (const e of EXAMS) {
    const id = demoId(e.key)
    const account = await UserModel.findOne({ where: { email: `${e.author}@saltmarsh.test` } })
    const author = account && (await getUser(account.id))
    if (!author || (await ExamModel.findByPk(id))) continue
    const examinedAt = new Date(now.getTime() - e.hoursAgo * 3_600_000).toISOString()
    await createExam(author, ExamInputSchema.parse({ ...e.findings, id, teamId: teamIds.get(e.team), examinedAt }))
    if (e.submit) await submitExam(author, id)
    created += 1
  }
  return created
}

import Papa from 'papaparse'
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { ExamSchema, type ExamInputRaw } from '#shared/schemas/exam'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { saveSettings } from '../settings/settings-calls.ts'
import { FIRST_RULES_ESTIMATE } from '../factories/first-rules.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'

type App = Awaited<ReturnType<typeof makeTestApp>>['app']
type Row = Record<string, string>

/** The columns README.md documents ("CSV columns"), in order. */
const DOCUMENTED_COLUMNS = [
  'exam_id',
  'patient_code',
  'patient_code_masked',
  'team',
  'examiner',
  'examined_at',
  'status',
  'version',
  'inclination_deg',
  'vein',
  'column_top',
  'not_assessable_reason',
  'height_method',
  'reading_precision',
  'context',
  'venous_confirmed',
  'height_cm',
  'offset_model',
  'offset_cm',
  'convention_diff_cm',
  'bound',
  'cvp_estimate_cmh2o',
  'cvp_estimate_mmhg',
  'estimate_band_low_cmh2o',
  'estimate_band_high_cmh2o',
  'estimate_band_low_mmhg',
  'estimate_band_high_mmhg',
  'estimate_sigma_cm',
  'observer_source',
  'observer_sigma_cm',
  'observer_n',
  'elevated',
  'elevated_statement',
  'estimated_categories',
  'category_statement',
  'confidence',
  'arterial_evidence',
  'arterial_warning',
  'frame_note',
  'other_cautions',
  'reviewed_band_low_cmh2o',
  'reviewed_band_high_cmh2o',
  'rules_version',
  'settings_version',
  'countersigned_by',
  'countersigned_at',
  'countersign_meaning',
  'countersign_valid',
  'countersignature',
  'caution',
]

let app: App
let wards = 0
/** Team names are unique: each test gets a ward of its own. */
const newWard = (name = `Ward ${++wards} South`) => makeWard(name)

beforeAll(async () => {
  ;({ app } = await makeTestApp())
})

function csvOf(auth: string, query: Record<string, string> = {}) {
  return request(app).get('/api/exports/exams.csv').query(query).set('Authorization', auth)
}

function parse(text: string) {
  const result = Papa.parse<Row>(text, { header: true, skipEmptyLines: true })
  expect(result.errors).toEqual([])
  return { fields: result.meta.fields ?? [], rows: result.data }
}

const submitted = (auth: string, teamId: string, overrides: Partial<ExamInputRaw> = {}) => recordSubmittedExam(app, auth, { teamId, ...overrides })

describe('GET /api/exports/exams.csv', () => {
  it('sends a header row of the documented columns and one row per exam that parses back (papaparse)', async () => {
    const ward = await newWard()
    const exam = await submitted(ward.resident.auth, ward.team.id)
    const signed = await act(app, ward.attending.auth, exam, 'countersign', SIGN)
    const signature = ExamSchema.parse(signed.body).signatures![0]!

    const res = await csvOf(ward.resident.auth)

    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/)
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="plumbline-exams-\d{4}-\d{2}-\d{2}\.csv"$/)
    const { fields, rows } = parse(res.text)
    expect(fields).toEqual(DOCUMENTED_COLUMNS)
    expect(rows).toHaveLength(1)
    // Worked example with Seth 2002's offset (9.7 cm at 45°): h 4 cm, ruler, incline-adjusted → 13.7 cmH₂O,
    // band 9.2–18.2
    expect(rows[0]).toMatchObject({
      exam_id: exam.id,
      patient_code: 'SM-0142',
      patient_code_masked: 'false',
      examiner: 'Dr Sam Whitcombe',
      examined_at: new Date(exam.examinedAt).toISOString(),
      status: 'countersigned',
      inclination_deg: '45',
      height_cm: '4',
      offset_model: 'incline-adjusted',
      offset_cm: '9.7',
      bound: 'point',
      cvp_estimate_cmh2o: '13.7',
      // Cook 1990 categories: the band 9.2–18.2 reaches normal (5–10) and high (> 10); McGee 1998: h 4 > 3 cm.
      estimated_categories: 'normal;high',
      category_statement: 'normal or high',
      confidence: 'indeterminate',
      elevated: 'true',
      elevated_statement: 'JVP elevated (more than 3 cm above the sternal angle)',
      arterial_evidence: 'false',
      arterial_warning: '',
      frame_note: '',
      observer_source: 'default',
      rules_version: '2',
      settings_version: '1',
      countersigned_by: 'Dr Tomas Lindqvist',
      countersigned_at: signature.signedAt,
      countersign_meaning: 'reviewed-agree',
      countersign_valid: 'true',
      caution: CAUTION_TEXT,
    })
    // NIST SP 811 (2008) App. B.8 → 1.35951 cmH₂O per mmHg; dot decimals
    expect(Number(rows[0]!.cvp_estimate_mmhg)).toBeCloseTo(13.7 / 1.35951, 2)
    // The band with the default error terms (README, Clinical rules): ±1.96·√(0.5² + 1.0² + 2.0²) = ±1.96·√5.25
    // around 13.7.
    expect(Number(rows[0]!.estimate_band_low_cmh2o)).toBeCloseTo(13.7 - 1.96 * Math.sqrt(5.25), 2)
    expect(Number(rows[0]!.estimate_band_high_cmh2o)).toBeCloseTo(13.7 + 1.96 * Math.sqrt(5.25), 2)
    expect(rows[0]!.countersignature).toMatch(/^Countersigned by Dr Tomas Lindqvist, .+; meaning: reviewed, and agrees with the findings; version \d+\.$/)
    expect(rows[0]!.countersignature).toContain(`version ${exam.version}.`)
  })

  it('gives a resident only their own exams, drafts included', async () => {
    const ward = await newWard()
    const colleague = await makeCaller({ teamIds: [ward.team.id] })
    const draft = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
    const sent = await submitted(ward.resident.auth, ward.team.id)
    await submitted(colleague.auth, ward.team.id)

    const { rows } = parse((await csvOf(ward.resident.auth)).text)

    expect(rows.map((r) => r.exam_id).sort()).toEqual([draft.id, sent.id].sort())
  })

  it('gives an attending their teams’ exams but not drafts, as the exam log does', async () => {
    const ward = await newWard()
    const elsewhere = await newWard()
    const draft = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
    const sent = await submitted(ward.resident.auth, ward.team.id)
    await submitted(elsewhere.resident.auth, elsewhere.team.id)

    const { rows } = parse((await csvOf(ward.attending.auth)).text)

    const ids = rows.map((r) => r.exam_id)
    expect(ids).toContain(sent.id)
    expect(ids).not.toContain(draft.id)
    expect(rows.every((r) => r.team === ward.team.name)).toBe(true)
  })

  it('gives an educator the program’s exams with every patient code masked, and no drafts', async () => {
    const ward = await newWard()
    const draft = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: 'SM-0901' })
    const sent = await submitted(ward.resident.auth, ward.team.id, { patientCode: 'SM-0902' })
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await csvOf(educator.auth, { teamId: ward.team.id })

    expect(res.text).not.toContain('SM-0902')
    const { rows } = parse(res.text)
    expect(rows.map((r) => r.exam_id)).toEqual([sent.id])
    expect(rows.map((r) => r.exam_id)).not.toContain(draft.id)
    expect(rows[0]).toMatchObject({ patient_code_masked: 'true' })
    expect(rows[0]!.patient_code).toMatch(/^P-[0-9a-f]{8}$/)
    const listed = await request(app).get(`/api/exams/${sent.id}`).set('Authorization', educator.auth)
    expect(rows[0]!.patient_code).toBe(listed.body.patientCode)
  })

  it('refuses an educator’s search by patient code with a field error, as the log does', async () => {
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await csvOf(educator.auth, { patientCode: 'SM-0142' })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields)).toEqual(['patientCode'])
  })

  it('applies the log’s filters: status, team and time range', async () => {
    const ward = await newWard()
    const old = await submitted(ward.resident.auth, ward.team.id, { examinedAt: '2026-01-10T09:00:00.000Z' })
    await submitted(ward.resident.auth, ward.team.id, { examinedAt: '2026-02-10T09:00:00.000Z' })
    await recordExam(app, ward.resident.auth, { teamId: ward.team.id, examinedAt: '2026-01-11T09:00:00.000Z' })

    const res = await csvOf(ward.resident.auth, { status: 'submitted', teamId: ward.team.id, from: '2026-01-01T00:00:00Z', to: '2026-01-31T23:59:59Z' })

    expect(parse(res.text).rows.map((r) => r.exam_id)).toEqual([old.id])
  })

  it('answers a malformed filter with field-level errors', async () => {
    const ward = await newWard()

    const res = await csvOf(ward.resident.auth, { from: 'last tuesday', status: 'signed' })

    expect(res.status).toBe(400)
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['from', 'status'])
  })

  it('refuses an admin, who does no clinical reading', async () => {
    const admin = await makeCaller({ roles: ['admin'] })

    const res = await csvOf(admin.auth)

    expect(res.status).toBe(403)
  })

  it('defuses cells a spreadsheet would run as formulas with a leading apostrophe, leaving negative numbers alone', async () => {
    const team = await makeTeam('=HYPERLINK("http://evil.example","Ward")')
    const resident = await makeCaller({ teamIds: [team.id], displayName: '@SUM(1+1)\n=cmd|calc' })
    await submitted(resident.auth, team.id, { patientCode: '-1-2', heightCm: -2 })

    const res = await csvOf(resident.auth)

    const [row] = parse(res.text).rows
    expect(row).toMatchObject({
      team: `'=HYPERLINK("http://evil.example","Ward")`,
      examiner: `'@SUM(1+1)\n=cmd|calc`,
      patient_code: `'-1-2`,
      height_cm: '-2',
    })
    for (const cell of Object.values(row!)) expect(cell).not.toMatch(/^[=+@]/)
  })

  it('audits the export with the filter and the row count; a searched code is kept only as its pseudonym', async () => {
    const ward = await newWard()
    await submitted(ward.resident.auth, ward.team.id, { patientCode: 'SM-0555' })
    await submitted(ward.resident.auth, ward.team.id, { patientCode: 'SM-0556' })

    await csvOf(ward.resident.auth, { status: 'submitted' })
    await csvOf(ward.resident.auth, { patientCode: 'SM-0555' })

    const events = await AuditEventModel.findAll({ where: { action: 'exams-export', actorId: ward.resident.user.id }, order: [['id', 'ASC']] })
    const changes = events.map((e) => JSON.parse(e.changes!))
    expect(changes[0]).toEqual({ format: 'csv', filter: { status: 'submitted' }, rows: 2, masked: 0 })
    expect(changes[1]).toMatchObject({ format: 'csv', rows: 1 })
    expect(changes[1].filter.patientCode).toMatch(/^P-[0-9a-f]{8}$/)
    expect(JSON.stringify(changes)).not.toContain('SM-0555')
    expect(events.every((e) => e.entityType === 'export')).toBe(true)
  })
})

describe('GET /api/exports/exams.csv: the estimate in words beside its numbers', () => {
  it('names the header as estimated and carries the caution on every row', async () => {
    const ward = await newWard()
    await submitted(ward.resident.auth, ward.team.id)

    const { fields, rows } = parse((await csvOf(ward.resident.auth)).text)

    expect(fields.filter((f) => f.startsWith('cvp_'))).toEqual(['cvp_estimate_cmh2o', 'cvp_estimate_mmhg'])
    expect(fields.filter((f) => f.includes('band') && !f.startsWith('reviewed_')).every((f) => f.startsWith('estimate_'))).toBe(true)
    expect(rows.every((r) => r.caution === CAUTION_TEXT)).toBe(true)
  })

  it('2 cm at 45°: not elevated, "normal or high", and the frame note explaining the 3 cm rule', async () => {
    const ward = await newWard()
    await submitted(ward.resident.auth, ward.team.id, { heightCm: 2 })

    const [row] = parse((await csvOf(ward.resident.auth)).text).rows

    // h 2 cm ≤ 3 cm: not elevated (McGee 1998); CVP 2 + 9.7 (Seth 2002, 45°) = 11.7, band 7.2–16.2: normal or high.
    expect(row).toMatchObject({
      cvp_estimate_cmh2o: '11.7',
      elevated: 'false',
      elevated_statement: 'JVP not elevated (not more than 3 cm above the sternal angle)',
      category_statement: 'normal or high',
    })
    expect(row!.frame_note).toContain('the 3 cm rule assumes the classical 5 cm offset')
    expect(row!.frame_note).toContain('9.7 cm')
  })

  it('a palpable pulsation confirmed venous: arterial evidence and its warning', async () => {
    const ward = await newWard()
    const venousSigns = { 'not-palpable': 'absent', 'double-peaked': 'present', 'falls-on-inspiration': 'present' } as const
    await submitted(ward.resident.auth, ward.team.id, { venousSigns, venousConfirmed: true })

    const [row] = parse((await csvOf(ward.resident.auth)).text).rows

    // Cook & Simel 1996 (JAMA 275:630–634): a palpable pulsation is the carotid's sign.
    expect(row).toMatchObject({ arterial_evidence: 'true', venous_confirmed: 'true' })
    expect(row!.arterial_warning).toMatch(/^Arterial evidence: the pulsation was palpable/)
    expect(row!.arterial_warning).toContain('The examiner confirmed the column is venous.')
  })

  it('lists the context flags, the reason a column was not assessable and the other cautions, never the prompts', async () => {
    const ward = await newWard()
    const first = await recordExam(app, ward.resident.auth, {
      teamId: ward.team.id,
      columnTop: 'not-assessable',
      heightCm: null,
      notAssessableReason: 'lines-or-dressings',
      context: ['positive-pressure-ventilation', 'tense-ascites'],
    })
    const second = await recordExam(app, ward.resident.auth, {
      teamId: ward.team.id,
      vein: 'left-internal',
      waveform: { aWave: 'normal', vWave: 'large', yDescent: 'normal' },
    })

    const res = await csvOf(ward.resident.auth)

    const { rows } = parse(res.text)
    const [notAssessable, leftVein] = [first, second].map((exam) => rows.find((r) => r.exam_id === exam.id))
    expect(notAssessable).toMatchObject({
      column_top: 'not-assessable',
      not_assessable_reason: 'lines-or-dressings',
      context: 'positive-pressure-ventilation;tense-ascites',
      bound: 'none',
      cvp_estimate_cmh2o: '',
      elevated_statement: '',
      category_statement: '',
    })
    expect(notAssessable!.other_cautions!.split(' | ')).toHaveLength(2)
    expect(leftVein!.other_cautions).toMatch(/left/i)
    expect(res.text).not.toContain('Prompt from Plumbline')
    expect(res.text).not.toMatch(/tricuspid regurgitation/i)
  })

  it('states "elevated" with the threshold of the settings version the estimate was saved with', async () => {
    const ward = await newWard()
    const admin = await makeCaller({ roles: ['admin'] })
    const before = await submitted(ward.resident.auth, ward.team.id, { heightCm: 4 })
    await saveSettings(app, admin.auth, { estimate: { elevatedAboveCm: 5 } })
    const after = await submitted(ward.resident.auth, ward.team.id, { heightCm: 4 })

    const rows = parse((await csvOf(ward.resident.auth)).text).rows

    const statementOf = (id: string) => rows.find((r) => r.exam_id === id)!.elevated_statement
    expect(statementOf(before.id)).toBe('JVP elevated (more than 3 cm above the sternal angle)')
    expect(statementOf(after.id)).toBe('JVP not elevated (not more than 5 cm above the sternal angle)')
  })

  it('exports an estimate saved under the first rules as it was saved, marked rules version 1', async () => {
    const ward = await newWard()
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
    await ExamModel.update({ estimate: JSON.stringify(FIRST_RULES_ESTIMATE) }, { where: { id: exam.id } })

    const [row] = parse((await csvOf(ward.resident.auth)).text).rows

    expect(row).toMatchObject({
      rules_version: '1',
      settings_version: '1',
      cvp_estimate_cmh2o: '13.7',
      estimate_band_low_cmh2o: '10.68',
      estimate_band_high_cmh2o: '16.72',
      estimated_categories: 'high',
      category_statement: 'high',
      observer_source: 'local-pairs',
      elevated_statement: 'JVP elevated (more than 3 cm above the sternal angle)',
    })
  })
})


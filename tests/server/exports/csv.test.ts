import Papa from 'papaparse'
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { ExamSchema, type ExamInputRaw } from '#shared/schemas/exam'
import { AuditEventModel } from '../../../server/models/index.ts'
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
  'height_method',
  'reading_precision',
  'height_cm',
  'offset_model',
  'offset_cm',
  'bound',
  'cvp_cmh2o',
  'cvp_mmhg',
  'band_low_cmh2o',
  'band_high_cmh2o',
  'band_low_mmhg',
  'band_high_mmhg',
  'sigma_cm',
  'observer_source',
  'elevated',
  'category',
  'confidence',
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
    // PRODUCT.md §4 worked example: h 4 cm at 45°, ruler, incline-adjusted → 13.7 cmH₂O, band 9.2–18.2
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
      cvp_cmh2o: '13.7',
      category: 'high',
      countersigned_by: 'Dr Tomas Lindqvist',
      countersigned_at: signature.signedAt,
      countersign_meaning: 'reviewed-agree',
      countersign_valid: 'true',
      caution: CAUTION_TEXT,
    })
    // NIST SP 811 (2008) App. B.8 → 1.35951 cmH₂O per mmHg (PRODUCT.md §4); dot decimals
    expect(Number(rows[0]!.cvp_mmhg)).toBeCloseTo(13.7 / 1.35951, 2)
    // PRODUCT.md §4 band with the default error terms: ±1.96·√(0.5² + 1.0² + 2.0²) = ±1.96·√5.25 around 13.7.
    expect(Number(rows[0]!.band_low_cmh2o)).toBeCloseTo(13.7 - 1.96 * Math.sqrt(5.25), 2)
    expect(Number(rows[0]!.band_high_cmh2o)).toBeCloseTo(13.7 + 1.96 * Math.sqrt(5.25), 2)
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

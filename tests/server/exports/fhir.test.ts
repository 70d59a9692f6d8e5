import { UcumLhcUtils } from '@lhncbc/ucum-lhc'
import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { ExamSchema, type Exam, type ExamInputRaw } from '#shared/schemas/exam'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'
import { validateR4 } from './fhir-r4.ts'
import { FIRST_RULES_ESTIMATE } from '../factories/first-rules.ts'

type App = Awaited<ReturnType<typeof makeTestApp>>['app']
type Ward = Awaited<ReturnType<typeof makeWard>>
// The Bundle as JSON; the tests walk it the way a receiving system would.
type Json = any

const UCUM = 'http://unitsofmeasure.org'
const OWN_OBSERVATION = 'https://plumbline.example/fhir/CodeSystem/observation'
const ucum = UcumLhcUtils.getInstance()

let app: App

beforeAll(async () => {
  ;({ app } = await makeTestApp())
})

let wards = 0
/** Team names are unique: each test gets a ward of its own. */
const newWard = () => makeWard(`Ward ${++wards} North`)

function fhirOf(auth: string, exam: Pick<Exam, 'id'>) {
  return request(app).get(`/api/exams/${exam.id}/fhir`).set('Authorization', auth)
}

async function countersigned(ward: Ward, overrides: Partial<ExamInputRaw> = {}): Promise<Exam> {
  const submitted = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, ...overrides })
  const res = await act(app, ward.attending.auth, submitted, 'countersign', SIGN)
  expect(res.status).toBe(200)
  return ExamSchema.parse(res.body)
}

const observationOf = (bundle: Json) => bundle.entry[0].resource
const resolve = (bundle: Json, reference: string) => bundle.entry.find((e: Json) => e.fullUrl === reference)?.resource
const componentOf = (observation: Json, code: string) => observation.component.find((c: Json) => c.code.coding[0].code === code)

/** Every Quantity in the Observation: its value and each component's. */
function quantitiesOf(observation: Json): Json[] {
  return [observation.valueQuantity, ...observation.component.map((c: Json) => c.valueQuantity)].filter(Boolean)
}

describe('GET /api/exams/:id/fhir — a countersigned exam', () => {
  let ward: Ward
  let exam: Exam
  let bundle: Json

  beforeAll(async () => {
    ward = await newWard()
    exam = await countersigned(ward)
    const res = await fhirOf(ward.resident.auth, exam)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^application\/fhir\+json/)
    bundle = JSON.parse(res.text)
  })

  it('is a Bundle that validates against the FHIR R4 specification (FHIR.js, R4 definitions)', () => {
    const result = validateR4(bundle)

    expect(result.errors).toEqual([])
    expect(result.valid).toBe(true)
    expect(bundle).toMatchObject({ resourceType: 'Bundle', type: 'collection' })
    expect(observationOf(bundle).resourceType).toBe('Observation')
  })

  it('the same validator refuses a broken copy, so a pass means something', () => {
    const broken = structuredClone(bundle)
    observationOf(broken).status = 'signed'
    observationOf(broken).valueQuantity.value = '13.7'
    observationOf(broken).valueQuantity.comparator = '≥'
    observationOf(broken).effectiveDateTime = 'yesterday'
    observationOf(broken).estimate = 13.7
    delete broken.entry.find((e: Json) => e.resource.resourceType === 'Provenance').resource.recorded

    const result = validateR4(broken)

    expect(result.valid).toBe(false)
    const errors = result.errors.join('\n')
    for (const location of [
      'Observation.status',
      'Observation.valueQuantity.value',
      'Observation.valueQuantity.comparator',
      'Observation.effectiveDateTime',
      'Observation.estimate',
      'Provenance.recorded',
    ])
      expect(errors).toContain(location)
  })

  it('gives every quantity a valid UCUM code (NLM ucum-lhc) in the UCUM system', () => {
    const quantities = quantitiesOf(observationOf(bundle))

    expect(new Set(quantities.map((q) => q.code))).toEqual(new Set(['cm[H2O]', 'mm[Hg]', 'cm', 'deg']))
    for (const q of quantities) {
      expect(q.system).toBe(UCUM)
      expect(ucum.validateUnitString(q.code).status, q.code).toBe('valid')
    }
    // the checker itself refuses the everyday spellings that are not UCUM codes
    expect(ucum.validateUnitString('cmH2O').status).toBe('invalid')
    expect(ucum.validateUnitString('mmHg').status).toBe('invalid')
  })

  it('carries the estimate of the worked example (Seth 2002 offset): 13.7 cmH₂O, band 9.2–18.2, h 4 cm at 45°', () => {
    const observation = observationOf(bundle)

    // Worked example, Seth 2002 offset: vertical h = 4 cm at 45°, ruler, incline-adjusted → offset 9.7, CVP 13.7 cmH₂O,
    // σ = √(0.25 + 1 + 4) = 2.29, band 9.2–18.2 cmH₂O.
    expect(observation.valueQuantity).toMatchObject({ value: 13.7, code: 'cm[H2O]' })
    expect(observation.valueQuantity.comparator).toBeUndefined()
    expect(componentOf(observation, 'cvp-band-low').valueQuantity.value).toBeCloseTo(13.7 - 1.96 * Math.sqrt(5.25), 2)
    expect(componentOf(observation, 'cvp-band-high').valueQuantity.value).toBeCloseTo(13.7 + 1.96 * Math.sqrt(5.25), 2)
    expect(componentOf(observation, 'jvp-height').valueQuantity).toMatchObject({ value: 4, code: 'cm' })
    expect(componentOf(observation, 'trunk-inclination').valueQuantity).toMatchObject({ value: 45, code: 'deg' })
    expect(componentOf(observation, 'offset-distance').valueQuantity).toMatchObject({ value: 9.7, code: 'cm' })
    expect(componentOf(observation, 'offset-model').valueCodeableConcept.coding[0].code).toBe('incline-adjusted')
    // the same numbers the exam API answers
    expect(observation.valueQuantity.value).toBeCloseTo(exam.estimate.cvpCmH2O!, 2)
    expect(componentOf(observation, 'cvp-band-low').valueQuantity.value).toBeCloseTo(exam.estimate.bandCmH2O![0]!, 2)
  })

  it('gives mmHg by the NIST SP 811 factor, agreeing with UCUM’s conversion', () => {
    const mmHg = componentOf(observationOf(bundle), 'cvp-estimate-mmhg').valueQuantity

    expect(mmHg.code).toBe('mm[Hg]')
    // NIST SP 811 (2008) App. B.8: 1 mmHg = 133.3224 Pa, 1 cmH₂O = 98.0665 Pa → 1.35951 cmH₂O per mmHg
    expect(mmHg.value).toBeCloseTo(13.7 / 1.35951, 2)
    // NLM ucum-lhc: UCUM's rounded mm[Hg] (133.322 Pa) differs by about 3 ppm, far below the two decimals sent
    expect(mmHg.value).toBeCloseTo(ucum.convertUnitTo('cm[H2O]', 13.7, 'mm[Hg]').toVal!, 2)
  })

  it('codes the estimate in our own system, not as a measured CVP, with the physical-examination method', () => {
    const observation = observationOf(bundle)

    expect(observation.code.coding).toEqual([expect.objectContaining({ system: OWN_OBSERVATION, code: 'cvp-estimate' })])
    expect(JSON.stringify(bundle)).not.toContain('loinc.org')
    expect(observation.category[0].coding[0]).toMatchObject({ code: 'exam' })
    expect(observation.method.coding[0]).toMatchObject({ system: 'http://snomed.info/sct', code: '5880005' })
    for (const component of observation.component) expect(component.code.coding[0].system).toBe(OWN_OBSERVATION)
  })

  it('names the examiner and the countersigning attending as performers, each with a role', () => {
    const observation = observationOf(bundle)

    const performers = observation.performer.map((ref: Json) => {
      const role = resolve(bundle, ref.reference)
      const person = resolve(bundle, role.practitioner.reference)
      return { role: role.code[0].coding[0].code, name: person.name[0].text, id: person.identifier[0].value }
    })

    expect(performers).toEqual([
      { role: 'examiner', name: 'Dr Sam Whitcombe', id: ward.resident.user.id },
      { role: 'countersigning-attending', name: 'Dr Tomas Lindqvist', id: ward.attending.user.id },
    ])
  })

  it('carries the signature in a Provenance: the verifier, the server’s time and the meaning', () => {
    const signature = exam.signatures![0]!
    const provenance = bundle.entry.find((e: Json) => e.resource.resourceType === 'Provenance').resource

    expect(provenance.target[0].reference).toBe(bundle.entry[0].fullUrl)
    expect(provenance.recorded).toBe(signature.signedAt)
    expect(provenance.agent[0].type.coding[0].code).toBe('verifier')
    expect(resolve(bundle, resolve(bundle, provenance.agent[0].who.reference).practitioner.reference).name[0].text).toBe('Dr Tomas Lindqvist')
    expect(provenance.signature[0].when).toBe(signature.signedAt)
    expect(provenance.signature[0].type.map((c: Json) => c.code)).toEqual(['1.2.840.10065.1.12.1.5', 'reviewed-agree'])
    expect(provenance.signature[0].extension[0].valueString).toBe(signature.hash)
  })

  it('notes the caution and the signature’s manifestation: printed name, date and time with zone, meaning', () => {
    const texts = observationOf(bundle).note.map((n: Json) => n.text)

    expect(texts).toContain(CAUTION_TEXT)
    const manifestation = texts.find((t: string) => t.startsWith('Countersigned by'))
    expect(manifestation).toContain('Dr Tomas Lindqvist')
    expect(manifestation).toContain('meaning: reviewed, and agrees with the findings')
    expect(manifestation).toMatch(/\d{1,2} \w{3} \d{4}, \d{2}:\d{2} /)
  })

  it('names the patient by an identifier reference carrying the code, at the time of the exam', () => {
    const observation = observationOf(bundle)

    expect(observation.subject).toEqual({
      type: 'Patient',
      identifier: { system: 'https://plumbline.example/fhir/sid/patient-code', value: 'SM-0142' },
    })
    expect(observation.effectiveDateTime).toBe(exam.examinedAt)
    expect(observation.status).toBe('final')
  })

  it('never sends a value and a reason for its absence together (FHIR R4 invariant obs-6, from memory)', () => {
    const observation = observationOf(bundle)

    for (const element of [observation, ...observation.component]) {
      const values = Object.keys(element).filter((k) => k.startsWith('value'))
      expect(values.length + (element.dataAbsentReason ? 1 : 0)).toBe(1)
    }
  })
})

describe('GET /api/exams/:id/fhir — status', () => {
  const statusOf = async (auth: string, exam: Pick<Exam, 'id'>) => observationOf(JSON.parse((await fhirOf(auth, exam)).text)).status

  it('a draft, a submitted and a returned exam are preliminary: nobody has verified them', async () => {
    const ward = await newWard()
    const draft = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
    const submitted = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })
    const toReturn = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })
    expect((await act(app, ward.attending.auth, toReturn, 'return', { comment: 'Re-measure at 30°' })).status).toBe(200)

    const statuses = [await statusOf(ward.resident.auth, draft), await statusOf(ward.resident.auth, submitted), await statusOf(ward.resident.auth, toReturn)]

    expect(statuses).toEqual(['preliminary', 'preliminary', 'preliminary'])
  })

  it('countersigned after an amendment is amended; the reopened draft in between is preliminary', async () => {
    const ward = await newWard()
    const first = await countersigned(ward)
    const reopened = await act(app, ward.resident.auth, first, 'amend', { baseVersion: first.version })
    expect(reopened.status).toBe(200)

    const whileDraft = await statusOf(ward.resident.auth, first)
    await act(app, ward.resident.auth, first, 'submit', { baseVersion: reopened.body.version })
    const signedAgain = await act(app, ward.attending.auth, first, 'countersign', SIGN)
    expect(signedAgain.status).toBe(200)
    const res = await fhirOf(ward.resident.auth, first)
    const bundle = JSON.parse(res.text)

    expect(whileDraft).toBe('preliminary')
    expect(observationOf(bundle).status).toBe('amended')
    expect(validateR4(bundle).errors).toEqual([])
    // both manifestations stay in the note: the superseded one and the one that holds now
    const texts: string[] = observationOf(bundle).note.map((n: Json) => n.text)
    expect(texts.filter((t) => t.startsWith('Superseded countersignature'))).toHaveLength(1)
    expect(texts.filter((t) => t.startsWith('Countersigned by'))).toHaveLength(1)
  })

  it('an unsigned exam names only the examiner and carries no Provenance', async () => {
    const ward = await newWard()
    const submitted = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })

    const bundle = JSON.parse((await fhirOf(ward.resident.auth, submitted)).text)

    expect(observationOf(bundle).performer).toHaveLength(1)
    expect(bundle.entry.some((e: Json) => e.resource.resourceType === 'Provenance')).toBe(false)
    expect(validateR4(bundle).errors).toEqual([])
  })
})

describe('GET /api/exams/:id/fhir — bounds', () => {
  it('a column above the visible neck is a lower bound: comparator >= on the value and on mmHg', async () => {
    const ward = await newWard()
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, columnTop: 'above-neck', heightCm: 8, inclinationDeg: 90 })

    const bundle = JSON.parse((await fhirOf(ward.resident.auth, exam)).text)

    const observation = observationOf(bundle)
    expect(observation.valueQuantity).toMatchObject({ comparator: '>=', value: 17.8 }) // 8 + 9.8 (Seth 2002, held above 60°)
    expect(componentOf(observation, 'cvp-estimate-mmhg').valueQuantity.comparator).toBe('>=')
    expect(componentOf(observation, 'cvp-band-high').dataAbsentReason.coding[0].code).toBe('not-applicable')
    expect(validateR4(bundle).errors).toEqual([])
  })

  it('no column even lying flat is an upper bound at the offset: comparator <=', async () => {
    const ward = await newWard()
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, columnTop: 'not-filled', heightCm: null, inclinationDeg: 0 })

    const bundle = JSON.parse((await fhirOf(ward.resident.auth, exam)).text)

    const observation = observationOf(bundle)
    expect(observation.valueQuantity).toMatchObject({ comparator: '<=', value: 5.4 }) // Seth 2002 supine median
    expect(componentOf(observation, 'jvp-height').dataAbsentReason.coding[0].code).toBe('not-applicable')
    expect(componentOf(observation, 'cvp-band-low').dataAbsentReason.coding[0].code).toBe('not-applicable')
    expect(validateR4(bundle).errors).toEqual([])
  })

  it('a column that could not be assessed sends no value, only the reason', async () => {
    const ward = await newWard()
    const exam = await recordExam(app, ward.resident.auth, {
      teamId: ward.team.id,
      columnTop: 'not-assessable',
      heightCm: null,
      notAssessableReason: 'other',
      notAssessableText: 'SM-0142 declined the exam',
    })

    const bundle = JSON.parse((await fhirOf(ward.resident.auth, exam)).text)

    const observation = observationOf(bundle)
    expect(observation.valueQuantity).toBeUndefined()
    expect(observation.dataAbsentReason.coding[0]).toMatchObject({ code: 'unknown' })
    const texts: string[] = observation.note.map((n: Json) => n.text)
    expect(texts).toContain(CAUTION_TEXT)
    expect(texts).toContain('The top of the venous column could not be assessed: there is no estimate. Reason: other reason.')
    // free text stays out of exports, as the notes do
    expect(JSON.stringify(bundle)).not.toContain('declined')
    expect(validateR4(bundle).errors).toEqual([])
  })
})

describe('GET /api/exams/:id/fhir — the note: statements and cautions, never prompts', () => {
  const notesOf = async (auth: string, exam: Pick<Exam, 'id'>): Promise<string[]> =>
    observationOf(JSON.parse((await fhirOf(auth, exam)).text)).note.map((n: Json) => n.text)

  it('carries the caution, then the arterial warning, then the elevated and category statements', async () => {
    const ward = await newWard()
    const venousSigns = { 'not-palpable': 'absent', 'double-peaked': 'present', 'falls-on-inspiration': 'present' } as const
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, venousSigns, venousConfirmed: true })

    const texts = await notesOf(ward.resident.auth, exam)

    // Worked example, h 4 cm at 45°: elevated (McGee 1998, h > 3 cm); band 9.2–18.2 reaches normal and high (Cook 1990).
    expect(texts[0]).toBe(CAUTION_TEXT)
    expect(texts[1]).toMatch(/^Arterial evidence: the pulsation was palpable/)
    expect(texts[2]).toBe('JVP elevated (more than 3 cm above the sternal angle)')
    expect(texts[3]).toBe('Estimated CVP category: normal or high (the categories the 95% band reaches).')
  })

  it('2 cm at 45° carries the frame note beside "not elevated"', async () => {
    const ward = await newWard()
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, heightCm: 2 })

    const texts = await notesOf(ward.resident.auth, exam)

    expect(texts).toContain('JVP not elevated (not more than 3 cm above the sternal angle)')
    expect(texts.some((t) => t.includes('the 3 cm rule assumes the classical 5 cm offset'))).toBe(true)
  })

  it('leaves the prompts out: they are not findings', async () => {
    const ward = await newWard()
    const waveform = { aWave: 'cannon', vWave: 'large', yDescent: 'steep' } as const
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, waveform })
    expect(exam.estimate.prompts.length).toBeGreaterThan(0)

    const res = await fhirOf(ward.resident.auth, exam)

    expect(res.text).not.toContain('Prompt from Plumbline')
    for (const prompt of exam.estimate.prompts) expect(res.text).not.toContain(prompt.finding)
  })

  it('says plainly when the band saved differs from the band reviewed, with both', async () => {
    const ward = await newWard()
    const reviewed = { bandCmH2O: [10.7, 16.7] as [number, number], observerSource: 'local-pairs' as const }
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id, reviewed })

    const texts = await notesOf(ward.resident.auth, exam)

    expect(texts).toContain(
      'The band shown when the exam was reviewed was 10.7–16.7 cmH2O (local error term from routine pairs); ' +
        'the band saved is 9.2–18.2 cmH2O (default error terms): the error term changed between review and saving.',
    )
  })

  it('exports an estimate saved under the first rules as it was saved', async () => {
    const ward = await newWard()
    const exam = await recordExam(app, ward.resident.auth, { teamId: ward.team.id })
    await ExamModel.update({ estimate: JSON.stringify(FIRST_RULES_ESTIMATE) }, { where: { id: exam.id } })

    const bundle = JSON.parse((await fhirOf(ward.resident.auth, exam)).text)

    const observation = observationOf(bundle)
    expect(observation.valueQuantity.value).toBe(13.7)
    expect(componentOf(observation, 'cvp-band-low').valueQuantity.value).toBe(10.68)
    expect(componentOf(observation, 'cvp-band-high').valueQuantity.value).toBe(16.72)
    const texts: string[] = observation.note.map((n: Json) => n.text)
    expect(texts).toContain('Estimated CVP category: high (the categories the 95% band reaches).')
    expect(texts.join('\n')).not.toContain('tricuspid regurgitation')
    expect(validateR4(bundle).errors).toEqual([])
  })
})

describe('GET /api/exams/:id/fhir — access and audit', () => {
  it('answers 404 to a resident who did not record the exam, and to an admin', async () => {
    const ward = await newWard()
    const exam = await submittedOnWard(ward)
    const other = await makeCaller({ teamIds: [ward.team.id] })
    const admin = await makeCaller({ roles: ['admin'] })

    const [asOther, asAdmin, unknown] = [await fhirOf(other.auth, exam), await fhirOf(admin.auth, exam), await fhirOf(ward.resident.auth, { id: crypto.randomUUID() })]

    expect([asOther.status, asAdmin.status, unknown.status]).toEqual([404, 404, 404])
    expect(asOther.body.error.code).toBe('exam-not-found')
  })

  it('gives an educator the pseudonym under its own identifier system, never the code', async () => {
    const ward = await newWard()
    const exam = await submittedOnWard(ward, { patientCode: 'SM-0777', notes: 'Seen with SM-0777’s daughter present' })
    const educator = await makeCaller({ roles: ['educator'] })

    const res = await fhirOf(educator.auth, exam)

    expect(res.status).toBe(200)
    expect(res.text).not.toContain('SM-0777')
    const subject = observationOf(JSON.parse(res.text)).subject
    expect(subject.identifier.system).toBe('https://plumbline.example/fhir/sid/patient-pseudonym')
    expect(subject.identifier.value).toMatch(/^P-[0-9a-f]{8}$/)
    const listed = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', educator.auth)
    expect(subject.identifier.value).toBe(listed.body.patientCode)
  })

  it('writes one exam-export event per export, naming the reader and the format; a refused one writes none', async () => {
    const ward = await newWard()
    const exam = await submittedOnWard(ward)
    const other = await makeCaller({ teamIds: [ward.team.id] })

    await fhirOf(ward.attending.auth, exam)
    await fhirOf(other.auth, exam)

    const events = await AuditEventModel.findAll({ where: { action: 'exam-export', entityId: exam.id } })
    expect(events.map((e) => ({ actorId: e.actorId, entityType: e.entityType, changes: JSON.parse(e.changes!) }))).toEqual([
      { actorId: ward.attending.user.id, entityType: 'exam', changes: { format: 'fhir-r4', version: exam.version, status: 'preliminary', codeMasked: false } },
    ])
  })
})

/** A submitted exam: access and audit do not need a signature, which costs a password hash check. */
function submittedOnWard(ward: Ward, overrides: Partial<ExamInputRaw> = {}) {
  return recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, ...overrides })
}

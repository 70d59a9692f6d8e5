import { createHash } from 'node:crypto'
import request from 'supertest'
import type { Sequelize } from 'sequelize'
import { beforeEach, describe, expect, it } from 'vitest'
import type { Exam } from '#shared/schemas/exam'
import { SignatureListSchema } from '#shared/schemas/signature'
import { SignatureModel } from '../../../server/models/index.ts'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from './ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let sequelize: Sequelize

beforeEach(async () => {
  ;({ app, sequelize } = await makeTestApp())
})

const RECORD_FIELDS = [
  'id', 'patientCode', 'teamId', 'examinedAt', 'notes', 'inclinationDeg', 'inclinationSource', 'vein', 'columnTop', 'heightMethod',
  'heightCm', 'alongNeckCm', 'readingPrecision', 'offsetModel', 'venousSigns', 'rhythm', 'waveform', 'respiratory', 'abdominojugular',
  'examinerId', 'version', 'estimate',
] as const

function sortedKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortedKeys)
  if (value && typeof value === 'object')
    return Object.fromEntries(Object.keys(value).sort().map((k) => [k, sortedKeys((value as Record<string, unknown>)[k])]))
  return value
}

/**
 * The hash that links a signature to its record (21 CFR 11.70), computed here from the exam as the API shows it:
 * SHA-256 of sorted-key JSON of the record fields.
 */
function expectedHash(exam: Exam): string {
  const record = Object.fromEntries(RECORD_FIELDS.map((f) => [f, exam[f] ?? null]))
  return createHash('sha256').update(JSON.stringify(sortedKeys(record))).digest('hex')
}

async function signedOnWard() {
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, notes: 'Sitting at 45°, café au lait' })
  const signed = await act(app, ward.attending.auth, exam, 'countersign', SIGN)
  return { ...ward, exam: signed.body as Exam }
}

async function signaturesAs(auth: string, exam: Pick<Exam, 'id'>) {
  const res = await request(app).get(`/api/exams/${exam.id}/signatures`).set('Authorization', auth)
  return { res, signatures: res.status === 200 ? SignatureListSchema.parse(res.body).signatures : [] }
}

async function failureOf(sql: string): Promise<string> {
  try {
    await sequelize.query(sql)
    return 'no error'
  } catch (e) {
    const err = e as { original?: Error; message: string }
    return err.original?.message ?? err.message
  }
}

describe('the signature hash', () => {
  it('is the SHA-256 of the canonical serialisation of the signed version', async () => {
    const { exam } = await signedOnWard()

    const stored = (await SignatureModel.findOne({ where: { examId: exam.id } }))!

    expect(stored.contentHash).toBe(expectedHash(exam))
    expect(createHash('sha256').update(stored.content).digest('hex')).toBe(stored.contentHash)
  })

  it.each([
    ['a measured height', () => `"heightCm" = 9`],
    ['the stored estimate', () => `estimate = replace(estimate, '"cvpCmH2O":13.7', '"cvpCmH2O":8.2')`],
    ['the author', (otherUserId: string) => `"examinerId" = '${otherUserId}'`],
    ['the version', () => `version = version + 1`],
    ['the notes', () => `notes = 'added later'`],
  ])('flags the signature invalid when %s is changed in the database behind the app', async (_what, set) => {
    const { attending, exam } = await signedOnWard()

    await sequelize.query(`UPDATE exams SET ${set(attending.user.id)} WHERE id = '${exam.id}'`)
    const { signatures } = await signaturesAs(attending.auth, exam)
    const read = await request(app).get(`/api/exams/${exam.id}`).set('Authorization', attending.auth)

    expect(signatures.map((s) => s.valid)).toEqual([false])
    expect(read.body.signatures[0].valid).toBe(false)
  })

  it('stays valid while the signed record is untouched', async () => {
    const { resident, exam } = await signedOnWard()

    const { signatures } = await signaturesAs(resident.auth, exam)

    expect(signatures.map((s) => s.valid)).toEqual([true])
  })
})

describe('GET /api/exams/:id/signatures', () => {
  it('shows the manifestation: printed name, time with offset and zone, meaning, superseded flag and hash', async () => {
    const { attending, exam } = await signedOnWard()

    const { res, signatures } = await signaturesAs(attending.auth, exam)

    expect(res.status).toBe(200)
    expect(signatures[0]).toMatchObject({
      signerName: 'Dr Tomas Lindqvist',
      meaning: 'reviewed-agree',
      timeZone: Intl.DateTimeFormat().resolvedOptions().timeZone,
      superseded: false,
      supersededAt: null,
      hash: expectedHash(exam),
    })
    expect(signatures[0]!.signedAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}[+-]\d\d:\d\d$/)
  })

  it('is readable by an educator, and answers 404 to another resident and to an admin', async () => {
    const { team, exam } = await signedOnWard()
    const educator = await makeCaller({ roles: ['educator'] })
    const other = await makeCaller({ teamIds: [team.id] })
    const admin = await makeCaller({ roles: ['admin'] })

    const statuses = []
    for (const caller of [educator, other, admin]) statuses.push((await signaturesAs(caller.auth, exam)).res.status)

    expect(statuses).toEqual([200, 404, 404])
  })
})

describe('the signatures table is append-only', () => {
  it('refuses DELETE', async () => {
    await signedOnWard()

    expect(await failureOf(`DELETE FROM signatures`)).toMatch(/append-only/)
    expect(await SignatureModel.count()).toBe(1)
  })

  it.each([
    ['the printed name', `"signerName" = 'Someone Else'`],
    ['the hash', `"contentHash" = 'abc'`],
    ['the meaning, while superseding', `meaning = 'reviewed-re-examined', "supersededAt" = '2026-01-01'`],
  ])('refuses an UPDATE of %s', async (_what, set) => {
    const { exam } = await signedOnWard()

    expect(await failureOf(`UPDATE signatures SET ${set}`)).toMatch(/append-only/)
    expect((await SignatureModel.findOne({ where: { examId: exam.id } }))!.toJSON()).toMatchObject({
      signerName: 'Dr Tomas Lindqvist',
      meaning: 'reviewed-agree',
      supersededAt: null,
    })
  })

  it.each([
    ['the feedback codes', `feedback = '["history"]'`],
    ['the feedback text', `"feedbackText" = 'rewritten later'`],
    ['the attending reading', `"readingExamId" = "examId"`],
  ])('refuses an UPDATE that marks the signature superseded and changes %s', async (_what, set) => {
    const { exam } = await signedOnWard()

    const failure = await failureOf(`UPDATE signatures SET "supersededAt" = '2026-01-01 00:00:00.000 +00:00', ${set}`)

    expect(failure).toMatch(/append-only/)
    expect((await SignatureModel.findOne({ where: { examId: exam.id } }))!.toJSON()).toMatchObject({
      supersededAt: null,
      feedback: null,
      feedbackText: null,
      readingExamId: null,
    })
  })

  it('allows marking a signature superseded once, and never un-marking or re-marking it', async () => {
    await signedOnWard()

    const first = await failureOf(`UPDATE signatures SET "supersededAt" = '2026-01-01 00:00:00.000 +00:00'`)
    const again = await failureOf(`UPDATE signatures SET "supersededAt" = '2026-02-01 00:00:00.000 +00:00'`)
    const unmark = await failureOf(`UPDATE signatures SET "supersededAt" = NULL`)

    expect([first, again, unmark]).toEqual(['no error', expect.stringMatching(/append-only/), expect.stringMatching(/append-only/)])
  })
})

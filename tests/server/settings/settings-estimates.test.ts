import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { ExamSchema } from '#shared/schemas/exam'
import { makeExamInput, recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { push, newExam } from '../sync/sync-calls.ts'
import { saveSettings } from './settings-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function ward() {
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const admin = await makeCaller({ roles: ['admin'] })
  return { team, resident, admin }
}

const readExam = async (auth: string, id: string) => ExamSchema.parse((await request(app).get(`/api/exams/${id}`).set('Authorization', auth)).body)

// Throughout: the worked example with Seth 2002's offset, h = 4 cm at 45°, ruler, incline-adjusted → 13.7 cmH₂O,
// band 9.2–18.2, elevated (McGee 1998: h > 3 cm) and a band reaching normal and high (Cook 1990 categories:
// > 10 cmH₂O) under the defaults. Raising the thresholds to elevated > 5 cm and high > 20 cmH₂O makes the same
// findings not elevated, and their band lies wholly in normal.
const RAISED = { estimate: { elevatedAboveCm: 5, highAboveCmH2O: 20 } }
const DEFAULT_JUDGEMENT = { elevated: true, categories: ['normal', 'high'], confidence: 'indeterminate' }
const RAISED_JUDGEMENT = { elevated: false, categories: ['normal'], confidence: 'clear' }

describe('settings and the estimates of exams (new estimates only)', () => {
  it('a new exam is judged by the new thresholds and records their version', async () => {
    const { team, resident, admin } = await ward()
    await saveSettings(app, admin.auth, RAISED)

    const exam = await recordExam(app, resident.auth, { teamId: team.id })

    expect(exam.estimate).toMatchObject({ ...RAISED_JUDGEMENT, settingsVersion: 2 })
    // Worked example (h 4 cm at 45°, Seth 2002 incline-adjusted offset): 13.7 cmH₂O, whatever the thresholds.
    expect(exam.estimate.cvpCmH2O).toBeCloseTo(13.7, 9)
  })

  it('an exam saved before the change keeps its estimate and its version, on every read', async () => {
    const { team, resident, admin } = await ward()
    const old = await recordSubmittedExam(app, resident.auth, { teamId: team.id })

    await saveSettings(app, admin.auth, RAISED)

    const read = await readExam(resident.auth, old.id)
    expect(read.estimate).toEqual(old.estimate)
    expect(read.estimate).toMatchObject({ ...DEFAULT_JUDGEMENT, settingsVersion: 1 })
    const list = await request(app).get('/api/exams').set('Authorization', resident.auth)
    expect(list.body.exams[0].estimate).toEqual(old.estimate)
  })

  it('a draft saved again without any change keeps the estimate it was computed with', async () => {
    const { team, resident, admin } = await ward()
    const draft = await recordExam(app, resident.auth, { teamId: team.id })
    await saveSettings(app, admin.auth, RAISED)

    const res = await request(app).patch(`/api/exams/${draft.id}`).set('Authorization', resident.auth).send({ baseVersion: 1, notes: '' })

    expect(res.status).toBe(200)
    expect(res.body.version).toBe(1)
    expect(res.body.estimate).toEqual(draft.estimate)
    expect((await readExam(resident.auth, draft.id)).estimate).toEqual(draft.estimate)
  })

  it('a draft whose findings change is estimated again under the settings in force', async () => {
    const { team, resident, admin } = await ward()
    const draft = await recordExam(app, resident.auth, { teamId: team.id })
    await saveSettings(app, admin.auth, RAISED)

    const res = await request(app).patch(`/api/exams/${draft.id}`).set('Authorization', resident.auth).send({ baseVersion: 1, heightCm: 4.5 })

    expect(res.status).toBe(200)
    // 4.5 + 9.7 = 14.2 cmH₂O, band 9.7–18.7: wholly normal under high > 20, and h = 4.5 is not above 5 cm.
    expect(res.body.estimate).toMatchObject({ ...RAISED_JUDGEMENT, settingsVersion: 2 })
  })

  it('POST /api/estimate answers with the thresholds and error terms in force', async () => {
    const { resident, admin } = await ward()
    const findings = makeExamInput({ teamId: 'any' })
    const before = await request(app).post('/api/estimate').set('Authorization', resident.auth).send(findings)

    await saveSettings(app, admin.auth, { ...RAISED, estimate: { ...RAISED.estimate, sigmaObserverCm: 1 } })
    const after = await request(app).post('/api/estimate').set('Authorization', resident.auth).send(findings)

    expect(before.body).toMatchObject({ ...DEFAULT_JUDGEMENT, settingsVersion: 1 })
    expect(after.body).toMatchObject({ ...RAISED_JUDGEMENT, settingsVersion: 2, observerSource: 'default', observerSigmaCm: 1 })
    // σ = √(σ_read² + σ_offset² + σ_observer²) with the observer term now 1 cm: √(0.25 + 1 + 1) = 1.5.
    expect(before.body.sigmaCm).toBeCloseTo(Math.hypot(0.5, 1, 2), 9)
    expect(after.body.sigmaCm).toBeCloseTo(1.5, 9)
  })

  it('an exam first pushed by sync after the change is estimated under the new settings', async () => {
    const { team, resident, admin } = await ward()
    await saveSettings(app, admin.auth, RAISED)
    const change = newExam(team.id)

    const res = await push(app, resident.auth, [change])

    expect(res.body.results[0].result).toBe('applied')
    expect((await readExam(resident.auth, change.exam.id)).estimate).toMatchObject({ ...RAISED_JUDGEMENT, settingsVersion: 2 })
  })
})

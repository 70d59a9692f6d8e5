import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { SettingsInForceSchema } from '#shared/schemas/settings'
import { invalidateObserverTerm } from '../../../server/agreement/observer-term.ts'
import { makeExamInput } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { saveSettings } from '../settings/settings-calls.ts'
import { storeThirtyPairs } from './factories.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
  invalidateObserverTerm()
})

/** 30 resident–attending pairs whose differences alternate +2 and −2 cm. */
const storeLocalPairs = (teamId: string) => storeThirtyPairs(teamId, { codePrefix: 'SM-9', firstDayAgo: 1 })

const settingsAs = async (auth: string) => SettingsInForceSchema.parse((await request(app).get('/api/settings').set('Authorization', auth)).body)

// SD(d) = √(120/29) for d = ±2 cm; σ_exam = SD/√2, replacing σ_read and σ_observer together.
const SIGMA_EXAM = Math.sqrt(120 / 29) / Math.SQRT2

describe('GET /api/settings: the error term in force travels with the settings', () => {
  it('without local data, is the default term taken from the settings (σ_observer 2.0 cm, product default)', async () => {
    const { auth } = await makeCaller()

    const settings = await settingsAs(auth)

    expect(settings.version).toBe(1)
    expect(settings.observerTerm).toEqual({ source: 'default', sigmaCm: 2, n: null, ci: null })
  })

  it('follows a new default σ_observer saved by an admin', async () => {
    const admin = await makeCaller({ roles: ['admin'] })
    await saveSettings(app, admin.auth, { estimate: { sigmaObserverCm: 2.5 } })

    const settings = await settingsAs(admin.auth)

    expect(settings.observerTerm).toEqual({ source: 'default', sigmaCm: 2.5, n: null, ci: null })
  })

  it('with 30 routine pairs, is the local term with its n', async () => {
    const team = await makeTeam()
    await storeLocalPairs(team.id)
    const { auth } = await makeCaller({ teamIds: [team.id] })

    const settings = await settingsAs(auth)

    expect(settings.observerTerm).toMatchObject({ source: 'local-pairs', n: 30, sigmaCm: expect.closeTo(SIGMA_EXAM, 10) })
  })
})

describe('estimates use the same term the device was given', () => {
  it('a saved exam’s band uses σ = √(σ_exam² + σ_offset²) and says which term and n it used', async () => {
    const team = await makeTeam()
    await storeLocalPairs(team.id)
    const author = await makeCaller({ teamIds: [team.id] })
    const term = (await settingsAs(author.auth)).observerTerm

    const res = await request(app).post('/api/exams').set('Authorization', author.auth).send(makeExamInput({ teamId: team.id }))

    // Worked example h = 4 cm at 45°: σ_offset 1.0 cm (Seth 2002 IQR ÷ 1.349); σ_read is part of σ_exam.
    expect(res.status).toBe(201)
    expect(res.body.estimate).toMatchObject({ observerSource: 'local-pairs', observerN: 30, observerSigmaCm: term.sigmaCm })
    expect(res.body.estimate.observerSigmaCi).toEqual(term.ci)
    expect(res.body.estimate.sigmaCm).toBeCloseTo(Math.hypot(SIGMA_EXAM, 1), 9)
  })

  it('POST /api/estimate uses the term GET /api/settings gives, default included', async () => {
    const team = await makeTeam()
    const author = await makeCaller({ teamIds: [team.id] })
    const term = (await settingsAs(author.auth)).observerTerm

    const res = await request(app).post('/api/estimate').set('Authorization', author.auth).send(makeExamInput({ teamId: team.id }))

    // Default terms: σ = √(0.5² + 1.0² + 2.0²) = 2.29 (worked example).
    expect(res.body).toMatchObject({ observerSource: term.source, observerSigmaCm: term.sigmaCm, settingsVersion: 1 })
    expect(res.body.sigmaCm).toBeCloseTo(Math.hypot(0.5, 1, 2), 9)
  })
})

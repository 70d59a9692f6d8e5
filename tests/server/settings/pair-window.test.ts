import { beforeEach, describe, expect, it } from 'vitest'
import { observerTerm } from '../../../server/agreement/observer-term.ts'
import { DAY, MINUTE, pairsAs, storeExam, storeExams } from '../agreement/factories.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { saveSettings } from './settings-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function ward() {
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  const educator = await makeCaller({ roles: ['educator'] })
  const admin = await makeCaller({ roles: ['admin'] })
  return { team, resident, attending, educator, admin }
}

describe('the pairing window setting', () => {
  it('exams 150 minutes apart pair only once the window is widened to 180 minutes, and no longer once narrowed again', async () => {
    const { team, resident, attending, educator, admin } = await ward()
    const at = Date.now() - 3 * DAY
    await storeExam({ teamId: team.id, examinerId: resident.user.id, at })
    await storeExam({ teamId: team.id, examinerId: attending.user.id, at: at + 150 * MINUTE })
    const before = await pairsAs(app, educator.auth)

    await saveSettings(app, admin.auth, { pairWindowMinutes: 180 })
    const widened = await pairsAs(app, educator.auth)
    await saveSettings(app, admin.auth, { pairWindowMinutes: 120 })
    const narrowed = await pairsAs(app, educator.auth)

    expect(before.list!.total).toBe(0)
    expect(widened.list!.total).toBe(1)
    expect(widened.list!.pairs[0]!.minutesApart).toBe(150)
    expect(narrowed.list!.total).toBe(0)
  })

  it('a wider window that brings the deployment to 30 pairs switches the observer term of new estimates to the local spread at once', async () => {
    const { team, resident, attending, admin } = await ward()
    await storeExams(
      Array.from({ length: 30 }, (_, i) => {
        const at = Date.now() - (i + 1) * DAY
        return [
          { teamId: team.id, patientCode: `SM-8${i}`, examinerId: resident.user.id, at, heightCm: i % 2 ? 2 : 6 },
          { teamId: team.id, patientCode: `SM-8${i}`, examinerId: attending.user.id, at: at + 150 * MINUTE, heightCm: 4 },
        ]
      }).flat(),
    )
    const before = await observerTerm()

    await saveSettings(app, admin.auth, { pairWindowMinutes: 180 })
    const after = await observerTerm()

    expect(before.source).toBe('default')
    // Differences alternate ±2 cm over 30 pairs: SD = √(120/29), σ_exam = SD/√2, each difference holding two examiners’ errors.
    expect(after).toMatchObject({ source: 'local-pairs', n: 30, sigmaCm: expect.closeTo(Math.sqrt(120 / 29) / Math.SQRT2, 9) })
  })
})

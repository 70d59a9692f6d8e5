import { beforeEach, describe, expect, it } from 'vitest'
import { invalidateObserverTerm, observerTerm } from '../../../server/agreement/observer-term.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { DAY, MINUTE, storeExam } from './factories.ts'

beforeEach(async () => {
  await makeTestApp()
  invalidateObserverTerm()
})

/** Resident–attending pairs whose differences alternate +1 and −1 cm, one a day, ending `daysAgo` days ago. */
async function storePairs(count: number, daysAgo = 1) {
  const team = await makeTeam()
  const resident = await makeCaller({ roles: ['resident'], teamIds: [team.id] })
  const attending = await makeCaller({ roles: ['attending'], teamIds: [team.id] })
  for (let i = 0; i < count; i++) {
    const at = Date.now() - (daysAgo + i) * DAY
    const common = { teamId: team.id, patientCode: `SM-${daysAgo}-${i}` }
    await storeExam({ ...common, examinerId: resident.user.id, at, heightCm: i % 2 ? 3 : 5 })
    await storeExam({ ...common, examinerId: attending.user.id, at: at + 30 * MINUTE, heightCm: 4 })
  }
}

// n differences of ±1 with mean 0: SD = √(n / (n − 1)); σ_observer = SD / √2 (§4.4).
const localSigma = (n: number) => Math.sqrt(n / (n - 1)) / Math.SQRT2

describe('observerTerm (PRODUCT.md §4.4)', () => {
  it('is the default 2.0 cm while the deployment holds fewer than 30 pairs', async () => {
    await storePairs(29)

    const term = await observerTerm()

    expect(term).toEqual({ sigmaCm: 2, source: 'default' })
  })

  it('at 30 pairs from the last year becomes the SD of their differences ÷ √2, marked local', async () => {
    await storePairs(30)

    const term = await observerTerm()

    expect(term.source).toBe('local')
    expect(term.sigmaCm).toBeCloseTo(localSigma(30), 12)
  })

  it('does not count pairs older than 365 days', async () => {
    await storePairs(29)
    await storePairs(1, 366)

    const term = await observerTerm()

    expect(term.source).toBe('default')
  })

  it('keeps its cached value until invalidated, then recomputes', async () => {
    await storePairs(29)
    const before = await observerTerm()
    await storePairs(1, 100)

    const cached = await observerTerm()
    invalidateObserverTerm()
    const recomputed = await observerTerm()

    expect(before.source).toBe('default')
    expect(cached.source).toBe('default')
    expect(recomputed.source).toBe('local')
  })
})

import { beforeAll, describe, expect, it } from 'vitest'
import { BlandAltmanSummarySchema, type AgreementPairList, type AgreementSummary } from '#shared/schemas/agreement'
import { seedDemoPairs } from '../../../server/demo/demo-pairs.ts'
import { seedDemo } from '../../../server/demo/seed.ts'
import { ExamModel, TeamModel } from '../../../server/models/index.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { pairsAs, summaryAs } from './factories.ts'

let summary: AgreementSummary
let list: AgreementPairList

// Seeded once for the file: the demo accounts take seconds of bcrypt hashing.
beforeAll(async () => {
  const { app } = await makeTestApp({ demo: true })
  await seedDemo()
  const educator = await makeCaller({ roles: ['educator'] })
  summary = (await summaryAs(app, educator.auth)).summary!
  list = (await pairsAs(app, educator.auth, { pageSize: 1000 })).list!
  // Seeding the whole demo hospital takes about 7 s alone on the 2-core machine, past the default 10 s hook limit when busy.
}, 60_000)

describe('demo agreement data (issue 6)', () => {
  it('holds at least 120 resident–attending pairs across the three teams', () => {
    const residentAttending = list.pairs.filter((p) => p.order === 'resident-minus-attending')

    expect(residentAttending.length).toBeGreaterThanOrEqual(120)
    expect(new Set(residentAttending.map((p) => p.first.teamId)).size).toBe(3)
  })

  it('shows residents reading about 1 cm lower than their attendings, with differences spread by about 1.5 cm', () => {
    const ba = BlandAltmanSummarySchema.parse(summary.blandAltman)
    const residents = summary.byExaminer.filter((e) => e.role === 'resident')

    expect(ba.bias).toBeGreaterThan(-1.4)
    expect(ba.bias).toBeLessThan(-0.6)
    expect(ba.sd).toBeGreaterThan(1.2)
    expect(ba.sd).toBeLessThan(1.9)
    expect(residents).toHaveLength(6)
    expect(residents.every((r) => r.bias < 0)).toBe(true)
  })

  it('records submitted exams at 30–60°, mostly on the right internal jugular', () => {
    const readings = list.pairs.flatMap((p) => [p.first, p.second])

    expect(readings.every((r) => r.inclinationDeg >= 30 && r.inclinationDeg <= 60)).toBe(true)
    expect(readings.filter((r) => r.vein === 'right-internal').length / readings.length).toBeGreaterThan(0.6)
  })

  it('adds nothing on a second run', async () => {
    const before = await ExamModel.count()
    const teams = new Map((await TeamModel.findAll()).map((t) => [t.name, t.id]))

    const created = await seedDemoPairs(teams)

    expect(created).toBe(0)
    expect(await ExamModel.count()).toBe(before)
  })
})

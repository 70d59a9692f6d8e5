import request from 'supertest'
import { beforeAll, describe, expect, it } from 'vitest'
import { AccuracySummarySchema } from '#shared/schemas/reference'
import { PatientTimelineSchema } from '#shared/schemas/timeline'
import { MyAgreementSchema } from '#shared/schemas/learning'
import { DEMO_PASSWORD, seedDemo } from '../../../server/demo/seed.ts'
import { ReferenceModel, SignatureModel } from '../../../server/models/index.ts'
import { makeTestApp, signIn } from '../helpers.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

// Seeded once for the file: the demo accounts' bcrypt hashes take seconds.
beforeAll(async () => {
  ;({ app } = await makeTestApp({ demo: true }))
  await seedDemo()
})

async function as(account: string) {
  const { token } = await signIn(app, `${account}@saltmarsh.test`, DEMO_PASSWORD)
  return `Bearer ${token}`
}

describe('demo data for closing the loop', () => {
  it('follows patient SM-0301 over three days with several of the ward’s exams and measured pressures', async () => {
    const res = await request(app)
      .get('/api/patients/SM-0301/timeline')
      .set('Authorization', await as('resident'))

    const { exams, references } = PatientTimelineSchema.parse(res.body)
    const hours = (Date.parse(exams.at(-1)!.examinedAt) - Date.parse(exams[0]!.examinedAt)) / 3_600_000
    expect(exams.length).toBeGreaterThanOrEqual(6)
    expect(hours).toBeGreaterThan(48)
    expect(new Set(exams.map((e) => e.examinerId)).size).toBeGreaterThanOrEqual(3)
    expect(references.length).toBeGreaterThanOrEqual(3)
  })

  it('puts measured pressures beside about 40 exams, central-line and echo values, some outside the band', async () => {
    const references = await ReferenceModel.findAll()
    const summary = AccuracySummarySchema.parse(
      (
        await request(app)
          .get('/api/agreement/accuracy')
          .set('Authorization', await as('educator'))
      ).body,
    )

    expect(new Set(references.map((r) => r.examId)).size).toBeGreaterThanOrEqual(35)
    expect(new Set(references.map((r) => r.kind))).toEqual(new Set(['central-line', 'catheter-ra', 'echo-ra']))
    expect(summary.coverage.n).toBeGreaterThanOrEqual(30)
    expect(summary.coverage.inside).toBeLessThan(summary.coverage.n)
    expect(summary.coverage.inside).toBeGreaterThan(summary.coverage.n / 2)
  })

  it('has attendings’ readings with feedback, which the residents see in their agreement', async () => {
    const readings = await SignatureModel.count({ where: { meaning: 'reviewed-re-examined' } })
    const mine = MyAgreementSchema.parse(
      (
        await request(app)
          .get('/api/agreement/mine')
          .set('Authorization', await as('resident'))
      ).body,
    )

    expect(readings).toBeGreaterThanOrEqual(3)
    expect(mine.feedback.length).toBeGreaterThanOrEqual(2)
    expect(mine.feedback.every((f) => f.codes.length > 0 && f.differenceCmH2O !== null)).toBe(true)
    expect(mine.n).toBeGreaterThanOrEqual(10)
  })

  it('adds nothing on a second run', async () => {
    const before = [await ReferenceModel.count(), await SignatureModel.count()]

    await seedDemo()

    expect([await ReferenceModel.count(), await SignatureModel.count()]).toEqual(before)
  })
})

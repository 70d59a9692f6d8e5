import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import { computeEstimate } from '#shared/domain/estimate'
import { ExamFindingsSchema, ExamSchema, type ReviewedBand } from '#shared/schemas/exam'
import { invalidateObserverTerm } from '../../../server/agreement/observer-term.ts'
import { storeThirtyPairs } from '../agreement/factories.ts'
import { makeExamInput, recordExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { push } from '../sync/sync-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
  invalidateObserverTerm()
})

async function ward() {
  const team = await makeTeam()
  return { team, resident: await makeCaller({ teamIds: [team.id] }) }
}

/** 30 resident–attending pairs, differences ±2 cm: the server's error term becomes local. */
async function storeLocalPairs(teamId: string) {
  await storeThirtyPairs(teamId, { codePrefix: 'SM-8', firstDayAgo: 2 })
  invalidateObserverTerm()
}

/** The band a device showed at review when it computed with the default error terms. */
function reviewedWithDefaults(): ReviewedBand {
  const device = computeEstimate(ExamFindingsSchema.parse(makeExamInput({ teamId: 'any' })))
  return { bandCmH2O: device.bandCmH2O, observerSource: device.observerSource }
}

const readExam = async (auth: string, id: string) => ExamSchema.parse((await request(app).get(`/api/exams/${id}`).set('Authorization', auth)).body)

describe('POST /api/exams with the band the examiner reviewed', () => {
  it('when the server computes the same band, stores no reviewed band', async () => {
    const { team, resident } = await ward()

    const exam = await recordExam(app, resident.auth, { teamId: team.id, reviewed: reviewedWithDefaults() })

    expect(exam.estimate.reviewed).toBeUndefined()
  })

  it('treats a band shown to one decimal as the same band (within 0.05 cm at each end)', async () => {
    const { team, resident } = await ward()
    const { bandCmH2O } = reviewedWithDefaults()
    const shown: ReviewedBand = { bandCmH2O: [Math.round(bandCmH2O![0]! * 10) / 10, Math.round(bandCmH2O![1]! * 10) / 10], observerSource: 'default' }

    const exam = await recordExam(app, resident.auth, { teamId: team.id, reviewed: shown })

    expect(exam.estimate.reviewed).toBeUndefined()
  })

  it('when the server’s error term changed after the review, keeps both bands: the saved one and the one reviewed', async () => {
    const { team, resident } = await ward()
    const reviewed = reviewedWithDefaults()
    await storeLocalPairs(team.id)

    const exam = await recordExam(app, resident.auth, { teamId: team.id, reviewed })

    expect(exam.estimate.observerSource).toBe('local-pairs')
    expect(exam.estimate.reviewed).toEqual(reviewed)
    expect(exam.estimate.bandCmH2O).not.toEqual(reviewed.bandCmH2O)
    expect((await readExam(resident.auth, exam.id)).estimate.reviewed).toEqual(reviewed)
  })

  it('keeps the reviewed band when only one end moved by more than 0.05 cm', async () => {
    const { team, resident } = await ward()
    const { bandCmH2O } = reviewedWithDefaults()
    const reviewed: ReviewedBand = { bandCmH2O: [bandCmH2O![0]!, bandCmH2O![1]! + 0.06], observerSource: 'default' }

    const exam = await recordExam(app, resident.auth, { teamId: team.id, reviewed })

    expect(exam.estimate.reviewed).toEqual(reviewed)
  })

  it('keeps the reviewed band when the band is the same but its error term came from another source', async () => {
    const { team, resident } = await ward()
    const reviewed: ReviewedBand = { ...reviewedWithDefaults(), observerSource: 'local-rounds' }

    const exam = await recordExam(app, resident.auth, { teamId: team.id, reviewed })

    expect(exam.estimate.reviewed).toEqual(reviewed)
  })
})

describe('PATCH /api/exams/:id with the band the examiner reviewed', () => {
  it('with a change, stores the reviewed band when it differs from the new estimate', async () => {
    const { team, resident } = await ward()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    const reviewed: ReviewedBand = { bandCmH2O: [1, 2], observerSource: 'default' }

    const res = await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', resident.auth).send({ heightCm: 5, reviewed, baseVersion: 1 })

    expect(res.status).toBe(200)
    expect(res.body.estimate.reviewed).toEqual(reviewed)
  })

  it('without a change, keeps the saved estimate exactly, reviewed band or not', async () => {
    const { team, resident } = await ward()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    const reviewed: ReviewedBand = { bandCmH2O: [1, 2], observerSource: 'default' }

    const res = await request(app).patch(`/api/exams/${exam.id}`).set('Authorization', resident.auth).send({ heightCm: 4, reviewed, baseVersion: 1 })

    expect(res.status).toBe(200)
    expect(res.body.version).toBe(1)
    expect(res.body.estimate).toEqual(exam.estimate)
  })
})

describe('POST /api/sync/push with the band the examiner reviewed', () => {
  it('stores the reviewed band of a new exam when it differs, and a retry of the same change is a duplicate', async () => {
    const { team, resident } = await ward()
    const reviewed = reviewedWithDefaults()
    await storeLocalPairs(team.id)
    const change = { exam: makeExamInput({ teamId: team.id, reviewed }), baseVersion: null }

    const first = await push(app, resident.auth, [change])
    const retry = await push(app, resident.auth, [change])

    expect(first.body.results[0]).toMatchObject({ result: 'applied' })
    expect(retry.body.results[0]).toMatchObject({ result: 'duplicate' })
    expect((await readExam(resident.auth, change.exam.id)).estimate.reviewed).toEqual(reviewed)
  })
})

describe('a saved estimate', () => {
  it('never changes when the error term changes afterwards', async () => {
    const { team, resident } = await ward()
    const exam = await recordExam(app, resident.auth, { teamId: team.id })
    await storeLocalPairs(team.id)

    const read = await readExam(resident.auth, exam.id)
    const listed = await request(app).get('/api/exams').set('Authorization', resident.auth)

    expect(exam.estimate.observerSource).toBe('default')
    expect(read.estimate).toEqual(exam.estimate)
    expect(listed.body.exams.find((e: { id: string }) => e.id === exam.id).estimate).toEqual(exam.estimate)
  })
})

import { randomUUID } from 'node:crypto'
import request from 'supertest'
import type { Sequelize } from 'sequelize'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { ExamListSchema, type Exam } from '#shared/schemas/exam'
import { SyncPullResponseSchema } from '#shared/schemas/sync'
import { clearExamCaches, EXAM_CACHE_TTL_MS } from '../../../server/exams/exam-caches.ts'
import { SignatureModel } from '../../../server/models/index.ts'
import { recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let sequelize: Sequelize

beforeEach(async () => {
  ;({ app, sequelize } = await makeTestApp())
})

afterEach(() => {
  vi.useRealTimers()
})

const CODE = 'SM-0042'
const NOTES = 'Bay 4, after the diuretic'

async function examLog(auth: string): Promise<Exam[]> {
  const res = await request(app).get('/api/exams').set('Authorization', auth).set('Accept-Encoding', 'br, gzip')
  if (res.status !== 200) throw new Error(`list: ${res.status} ${JSON.stringify(res.body)}`)
  return ExamListSchema.parse(res.body).exams
}

async function pulled(auth: string): Promise<Exam[]> {
  const res = await request(app).get('/api/sync/pull').query({ cursor: 0 }).set('Authorization', auth)
  return SyncPullResponseSchema.parse(res.body).exams as Exam[]
}

/** A submitted exam on a ward, its author, the ward's attending, an educator of the program and a resident of another team. */
async function readers() {
  const ward = await makeWard()
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode: CODE, notes: NOTES })
  const educator = await makeCaller({ roles: ['educator'] })
  const stranger = await makeCaller({ teamIds: [(await makeWard('Ward 2 South')).team.id] })
  return { ...ward, exam, educator, stranger }
}

const seen = (exams: Exam[]) => exams.map((e) => [e.patientCode, e.notes])

describe('cached exam log and sync pull: each reader sees their own view', () => {
  it('when the author, an educator, the attending, a stranger and the author again read the log in turn, each sees what they may', async () => {
    const { resident, attending, educator, stranger } = await readers()

    const views = [await examLog(resident.auth), await examLog(educator.auth), await examLog(attending.auth)]
    const [strangers, again] = [await examLog(stranger.auth), await examLog(resident.auth)]

    expect(seen(views[0]!)).toEqual([[CODE, NOTES]])
    expect(seen(views[1]!)).toEqual([[expect.stringMatching(/^P-[0-9a-f]{8}$/), '']])
    expect(seen(views[2]!)).toEqual([[CODE, NOTES]])
    expect(strangers).toEqual([])
    expect(seen(again)).toEqual([[CODE, NOTES]])
  })

  it('when an educator pulls before the author, the author still pulls the real code and notes', async () => {
    const { resident, educator } = await readers()

    const masked = await pulled(educator.auth)
    const own = await pulled(resident.auth)

    expect(seen(masked)).toEqual([[expect.stringMatching(/^P-/), '']])
    expect(seen(own)).toEqual([[CODE, NOTES]])
  })
})

describe('cached exam log and sync pull: writes show on the next read', () => {
  it('when the attending returns an exam, the author’s next log and pull show it returned, with the comment', async () => {
    const { resident, attending, exam } = await readers()
    await Promise.all([examLog(resident.auth), pulled(resident.auth)])

    await act(app, attending.auth, exam, 'return', { comment: 'Re-measure at 45°', baseVersion: exam.version })
    const [log, pull] = [await examLog(resident.auth), await pulled(resident.auth)]

    for (const exams of [log, pull])
      expect(exams.map((e) => [e.status, e.version, e.returnComment])).toEqual([['returned', exam.version + 1, 'Re-measure at 45°']])
  })

  it('when the signed exam is changed in the database behind the app, the next log flags its signature, with no cache cleared', async () => {
    const { resident, attending, exam } = await readers()
    await act(app, attending.auth, exam, 'countersign', SIGN)
    const before = await examLog(resident.auth)

    await sequelize.query(`UPDATE exams SET "heightCm" = 9 WHERE id = '${exam.id}'`)
    const after = await examLog(resident.auth)

    expect(before[0]!.signatures!.map((s) => s.valid)).toEqual([true])
    expect(after[0]!.signatures!.map((s) => s.valid)).toEqual([false])
  })
})

/** A signature row written straight into the table, bypassing the app: its hash matches no content. */
async function forgeSignature(exam: Exam, signerId: string) {
  const at = new Date()
  const fields = { examId: exam.id, examVersion: exam.version, signerId, signerName: 'Nobody', meaning: 'reviewed-agree' }
  await SignatureModel.create({ id: randomUUID(), ...fields, signedAt: at, content: '{}', contentHash: 'forged', supersededAt: at })
}

describe('cached exam log: what the keys cannot see', () => {
  it('when a signature row is written behind the app, shows it flagged invalid once the caches are cleared', async () => {
    const { resident, attending, exam } = await readers()
    await examLog(resident.auth)
    await forgeSignature(exam, attending.user.id)

    clearExamCaches()
    const log = await examLog(resident.auth)

    expect(log[0]!.signatures!.map((s) => [s.hash, s.valid])).toEqual([['forged', false]])
  })

  it('when a signature row is written behind the app, shows it flagged invalid once the time to live has passed', async () => {
    vi.useFakeTimers({ toFake: ['Date'] })
    const { resident, attending, exam } = await readers()
    await examLog(resident.auth)
    await forgeSignature(exam, attending.user.id)

    vi.setSystemTime(Date.now() + EXAM_CACHE_TTL_MS)
    const log = await examLog(resident.auth)

    expect(log[0]!.signatures!.map((s) => [s.hash, s.valid])).toEqual([['forged', false]])
  })
})

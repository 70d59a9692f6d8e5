import { beforeEach, describe, expect, it } from 'vitest'
import type { Exam } from '#shared/schemas/exam'
import { SyncPullResponseSchema, type SyncPullResponse } from '#shared/schemas/sync'
import { ExamModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'
import { pull } from './sync-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function pullPage(auth: string, cursor = 0, limit?: number): Promise<SyncPullResponse> {
  const res = await pull(app, auth, cursor, limit)
  expect(res.status).toBe(200)
  return SyncPullResponseSchema.parse(res.body)
}

/** Pulls until the server has nothing more, as the device does, and answers the last cursor. */
async function pullToEnd(auth: string, cursor = 0): Promise<number> {
  for (let page = { cursor, more: true }; ; ) {
    page = await pullPage(auth, page.cursor)
    if (!page.more) return page.cursor
  }
}

/** A submitted exam of the ward's resident that the attending countersigned or returned. */
async function reviewedExam(ward: Awaited<ReturnType<typeof makeWard>>, action: 'countersign' | 'return', patientCode = 'SM-0142') {
  const exam = await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id, patientCode })
  const body = action === 'countersign' ? SIGN : { comment: 'Recheck at 45 degrees' }
  const res = await act(app, ward.attending.auth, exam, action, body)
  expect(res.status).toBe(200)
  return res.body as Exam
}

async function amend(auth: string, exam: Exam) {
  const res = await act(app, auth, exam, 'amend', { baseVersion: exam.version })
  expect(res.status).toBe(200)
  return res.body as Exam
}

describe('GET /api/sync/pull: exams the caller may no longer read', () => {
  it.each(['countersign', 'return'] as const)(
    'when the author amends a %sed exam back to draft, the attending’s next pull lists its id as removed, not as an exam',
    async (action) => {
      const ward = await makeWard()
      const exam = await reviewedExam(ward, action, 'SM-0808')
      const cursor = await pullToEnd(ward.attending.auth)

      await amend(ward.resident.auth, exam)
      const res = await pull(app, ward.attending.auth, cursor)

      const page = SyncPullResponseSchema.parse(res.body)
      const row = (await ExamModel.findByPk(exam.id))!
      expect(page.exams).toEqual([])
      expect(res.body.removed).toEqual([{ id: exam.id, syncSeq: row.syncSeq }])
      expect(page.cursor).toBe(row.syncSeq)
      expect(JSON.stringify(res.body)).not.toContain('SM-0808')
    },
  )

  it('the author still pulls the amended exam itself, as a draft', async () => {
    const ward = await makeWard()
    const exam = await reviewedExam(ward, 'countersign')
    const cursor = await pullToEnd(ward.resident.auth)

    await amend(ward.resident.auth, exam)
    const page = await pullPage(ward.resident.auth, cursor)

    expect(page.exams.map((e) => [e.id, e.status])).toEqual([[exam.id, 'draft']])
    expect(page.removed).toEqual([])
  })

  it('once resubmitted, the exam comes back to the attending as an exam', async () => {
    const ward = await makeWard()
    const exam = await reviewedExam(ward, 'return')
    const cursor = await pullToEnd(ward.attending.auth)
    const draft = await amend(ward.resident.auth, exam)
    const afterRemoval = await pullToEnd(ward.attending.auth, cursor)

    await act(app, ward.resident.auth, draft, 'submit', { baseVersion: draft.version })
    const page = await pullPage(ward.attending.auth, afterRemoval)

    expect(page.exams.map((e) => [e.id, e.status])).toEqual([[exam.id, 'submitted']])
    expect(page.removed).toEqual([])
  })

  it('tells an educator, who read the exam with the code masked, to drop it once amended', async () => {
    const ward = await makeWard()
    const educator = await makeCaller({ roles: ['educator'] })
    const exam = await reviewedExam(ward, 'countersign')
    const cursor = await pullToEnd(educator.auth)

    await amend(ward.resident.auth, exam)
    const page = await pullPage(educator.auth, cursor)

    expect(page.exams).toEqual([])
    expect(page.removed?.map((r) => r.id)).toEqual([exam.id])
  })

  it('never gives another team’s attending or a fellow resident anything of an amended exam, not even its id', async () => {
    const ward = await makeWard('Acute Medical Unit')
    const other = await makeWard('Medical ICU')
    const fellow = await makeCaller({ teamIds: [ward.team.id] })
    // each already holds something, so each pulls from a cursor past 0
    await recordSubmittedExam(app, other.resident.auth, { teamId: other.team.id })
    await recordExam(app, fellow.auth, { teamId: ward.team.id })
    const start = {
      attending: await pullToEnd(other.attending.auth),
      fellow: await pullToEnd(fellow.auth),
    }
    const bodies: string[] = []
    const pullAllAs = async (auth: string, cursor: number) => {
      let page = { cursor, more: true }
      while (page.more) {
        const res = await pull(app, auth, page.cursor, 1)
        bodies.push(JSON.stringify(res.body))
        page = SyncPullResponseSchema.parse(res.body)
      }
      return page.cursor
    }
    const exam = await reviewedExam(ward, 'countersign', 'SM-0999')

    const draft = await amend(ward.resident.auth, exam)
    expect(Math.min(start.attending, start.fellow)).toBeGreaterThan(0)
    start.attending = await pullAllAs(other.attending.auth, start.attending)
    start.fellow = await pullAllAs(fellow.auth, start.fellow)
    await act(app, ward.resident.auth, draft, 'submit', { baseVersion: draft.version })
    await pullAllAs(other.attending.auth, start.attending)
    await pullAllAs(fellow.auth, start.fellow)

    for (const body of bodies) {
      expect(body).not.toContain(exam.id)
      expect(body).not.toContain('SM-0999')
    }
  })

  it('a device pulling from the start gets no removals: it holds nothing to drop', async () => {
    const ward = await makeWard()
    const exam = await reviewedExam(ward, 'countersign')
    await amend(ward.resident.auth, exam)

    const page = await pullPage(ward.attending.auth)

    expect(page.exams).toEqual([])
    expect(page.removed).toEqual([])
  })

  it('pages through changed and removed exams together with no gaps or repeats while writes happen between pages', async () => {
    const ward = await makeWard()
    const signed: Exam[] = []
    for (let i = 0; i < 4; i++) signed.push(await reviewedExam(ward, 'countersign'))
    const returned = await reviewedExam(ward, 'return')
    const cursor = await pullToEnd(ward.attending.auth)
    const draftOf: Record<string, Exam> = {}
    for (const exam of [signed[0]!, signed[2]!, returned]) draftOf[exam.id] = await amend(ward.resident.auth, exam)
    const fresh: Exam[] = [await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id })]
    const writesAfterPage = [
      async () => {
        await amend(ward.resident.auth, signed[3]!) // not yet delivered: a removal
        fresh.push(await recordSubmittedExam(app, ward.resident.auth, { teamId: ward.team.id }))
      },
      async () => {
        // delivered as removed on an earlier page: comes again, as an exam, at its new place
        const draft = draftOf[signed[0]!.id]!
        await act(app, ward.resident.auth, draft, 'submit', { baseVersion: draft.version })
        await recordExam(app, ward.resident.auth, { teamId: ward.team.id }) // a draft the attending never sees
      },
    ]

    const seen: string[] = []
    const removedIds: string[] = []
    const examIds: string[] = []
    let page = { cursor, more: true }
    for (let index = 0; page.more; index++) {
      const next = await pullPage(ward.attending.auth, page.cursor, 2)
      expect(next.exams.length + next.removed!.length).toBeLessThanOrEqual(2)
      seen.push(...next.exams.map((e) => `${e.id}@${e.version}`), ...next.removed!.map((r) => `${r.id}#${r.syncSeq}`))
      removedIds.push(...next.removed!.map((r) => r.id))
      examIds.push(...next.exams.map((e) => e.id))
      page = next
      await writesAfterPage[index]?.()
    }

    expect(new Set(seen).size).toBe(seen.length)
    expect(removedIds.sort()).toEqual([signed[0]!.id, signed[2]!.id, returned.id, signed[3]!.id].sort())
    expect(examIds.sort()).toEqual([...fresh.map((e) => e.id), signed[0]!.id].sort())
    for (const row of await ExamModel.findAll({ where: { id: [signed[2]!.id, returned.id, signed[3]!.id] } }))
      expect(seen).toContain(`${row.id}#${row.syncSeq}`)
    expect(examIds).not.toContain(signed[1]!.id)
  })
})

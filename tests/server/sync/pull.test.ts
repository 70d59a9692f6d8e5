import request from 'supertest'
import { beforeEach, describe, expect, it } from 'vitest'
import type { Exam } from '#shared/schemas/exam'
import { SyncPullResponseSchema } from '#shared/schemas/sync'
import { ExamModel } from '../../../server/models/index.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { act, makeWard, SIGN } from '../supervision/ward.ts'
import { pull } from './sync-calls.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']

beforeEach(async () => {
  ;({ app } = await makeTestApp())
})

async function pullAll(auth: string, cursor = 0) {
  const res = await pull(app, auth, cursor)
  return SyncPullResponseSchema.parse(res.body)
}

describe('GET /api/sync/pull', () => {
  it('from the start, returns the viewer’s exams in the order they were written, with the cursor to continue from', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    const first = await recordExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0001' })
    const second = await recordExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0002' })

    const page = await pullAll(resident.auth)

    expect(page.exams.map((e) => [e.id, e.patientCode])).toEqual([[first.id, 'SM-0001'], [second.id, 'SM-0002']])
    expect(page.more).toBe(false)
    expect(page.cursor).toBeGreaterThan(0)
  })

  it('pages through every change exactly once while other writes happen between pages', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    const exams: Exam[] = []
    for (let i = 0; i < 7; i++) exams.push(await recordExam(app, resident.auth, { teamId: team.id }))
    const edit = (exam: Exam) =>
      request(app).patch(`/api/exams/${exam.id}`).set('Authorization', resident.auth).send({ notes: 'seen again', baseVersion: 1 })
    const writesAfterPage = [
      async () => {
        await edit(exams[0]!) // already delivered: comes again as version 2
        await edit(exams[5]!) // not yet delivered: comes once, as version 2
        exams.push(await recordExam(app, resident.auth, { teamId: team.id }))
      },
      async () => void exams.push(await recordExam(app, resident.auth, { teamId: team.id })),
    ]

    const seen: string[] = []
    let page = { cursor: 0, more: true }
    for (let index = 0; page.more; index++) {
      const next = SyncPullResponseSchema.parse((await pull(app, resident.auth, page.cursor, 3)).body)
      seen.push(...next.exams.map((e) => `${e.id}@${e.version}`))
      page = next
      await writesAfterPage[index]?.()
    }

    expect(new Set(seen).size).toBe(seen.length)
    const stored = await ExamModel.findAll()
    expect(stored).toHaveLength(9)
    for (const row of stored) expect(seen).toContain(`${row.id}@${row.version}`)
    expect(seen.filter((s) => s.startsWith(exams[0]!.id))).toEqual([`${exams[0]!.id}@1`, `${exams[0]!.id}@2`])
    expect(seen.filter((s) => s.startsWith(exams[5]!.id))).toEqual([`${exams[5]!.id}@2`])
  })

  it('brings the author a countersign and a return made by the attending', async () => {
    const { team, resident, attending } = await makeWard()
    const signed = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    const returned = await recordSubmittedExam(app, resident.auth, { teamId: team.id })
    const { cursor } = await pullAll(resident.auth)

    await act(app, attending.auth, signed, 'countersign', SIGN)
    await act(app, attending.auth, returned, 'return', { comment: 'Measure from the sternal angle' })
    const page = await pullAll(resident.auth, cursor)

    expect(page.exams.map((e) => [e.id, e.status])).toEqual([[signed.id, 'countersigned'], [returned.id, 'returned']])
    expect(page.exams[0]!.signatures).toHaveLength(1)
    expect(page.exams[1]!.returnComment).toBe('Measure from the sternal angle')
  })

  it('leaves out what the viewer may not read: another resident’s exams, and drafts for the attending', async () => {
    const { team, resident, attending } = await makeWard()
    const colleague = await makeCaller({ teamIds: [team.id] })
    const mine = await recordExam(app, resident.auth, { teamId: team.id })
    await recordExam(app, colleague.auth, { teamId: team.id })
    const submitted = await recordSubmittedExam(app, colleague.auth, { teamId: team.id })

    const residentPage = await pullAll(resident.auth)
    const attendingPage = await pullAll(attending.auth)

    expect(residentPage.exams.map((e) => e.id)).toEqual([mine.id])
    expect(attendingPage.exams.map((e) => e.id)).toEqual([submitted.id])
  })

  it('shows an educator submitted exams with the patient code masked', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    await recordSubmittedExam(app, resident.auth, { teamId: team.id, patientCode: 'SM-0157' })
    const educator = await makeCaller({ roles: ['educator'] })

    const page = await pullAll(educator.auth)

    expect(page.exams).toHaveLength(1)
    expect(page.exams[0]!.patientCode).toMatch(/^P-[0-9a-f]{8}$/)
  })

  it('when nothing changed, keeps the cursor and says there is no more', async () => {
    const team = await makeTeam()
    const resident = await makeCaller({ teamIds: [team.id] })
    await recordExam(app, resident.auth, { teamId: team.id })
    const { cursor } = await pullAll(resident.auth)

    const page = await pullAll(resident.auth, cursor)

    expect(page).toEqual({ exams: [], removed: [], cursor, more: false })
  })

  it('answers 400 to a page larger than 500 and 403 to an admin', async () => {
    const resident = await makeCaller()
    const admin = await makeCaller({ roles: ['admin'] })

    const tooLarge = await pull(app, resident.auth, 0, 501)
    const forbidden = await pull(app, admin.auth)

    expect(tooLarge.status).toBe(400)
    expect(forbidden.status).toBe(403)
  })
})

import request from 'supertest'
import { beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { EXAM_COUNT_CAP, ExamListSchema, ExamSortSchema, type Exam, type ExamList } from '#shared/schemas/exam'
import { makeCaller, makeTeam, makeTestApp } from '../helpers.ts'
import { recordExam, recordSubmittedExam } from '../factories/exam.ts'
import { columnNames } from '../db/schema-snapshot.ts'

let app: Awaited<ReturnType<typeof makeTestApp>>['app']
let sequelize: Awaited<ReturnType<typeof makeTestApp>>['sequelize']
let auth: string
let teamId: string

/** A new app on a database of its own, a team and a resident of it. */
async function freshApp() {
  ;({ app, sequelize } = await makeTestApp())
  teamId = (await makeTeam()).id
  ;({ auth } = await makeCaller({ teamIds: [teamId] }))
}

const at = (hour: number) => new Date(Date.UTC(2026, 10, 2, hour)).toISOString()
const NOT_ASSESSABLE = { columnTop: 'not-assessable', heightCm: null, notAssessableReason: 'habitus' } as const

/** Ten exams with ties on every sort: shared times, shared heights, shared codes, two statuses, two with no estimate. */
async function recordTen(): Promise<Exam[]> {
  const exams: Exam[] = []
  for (let i = 0; i < 10; i++) {
    const values = {
      teamId,
      examinedAt: at(i % 4),
      patientCode: `SM-${i % 3}`,
      heightCm: i % 2 ? 4 : 6,
      ...(i % 5 === 4 ? NOT_ASSESSABLE : {}),
    }
    exams.push(await (i % 3 ? recordExam(app, auth, values) : recordSubmittedExam(app, auth, values)))
  }
  return exams
}

async function page(query: Record<string, string | number>): Promise<ExamList> {
  const res = await request(app).get('/api/exams').set('Authorization', auth).query(query)
  expect(res.status).toBe(200)
  return ExamListSchema.parse(res.body)
}

async function changeNotes(id: string, notes: string): Promise<void> {
  const { body } = await request(app).get(`/api/exams/${id}`).set('Authorization', auth).expect(200)
  await request(app).patch(`/api/exams/${id}`).set('Authorization', auth).send({ baseVersion: body.version, notes }).expect(200)
}

/** Stores `count` copies of an exam under new ids, in one statement (the triggers give each its sync cursor). */
async function copyExam(id: string, count: number): Promise<void> {
  const names = (await columnNames(sequelize, 'exams')).filter((name) => name !== 'syncSeq')
  const values = names.map((name) => (name === 'id' ? `'copy-' || n.i` : `e."${name}"`))
  await sequelize.query(
    `WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < ${count})
     INSERT INTO exams (${names.map((name) => `"${name}"`).join(', ')}) SELECT ${values.join(', ')} FROM n, exams e WHERE e.id = :id`,
    { replacements: { id } },
  )
}

/** Every page through the cursor, calling `between` after each; answers the ids in the order they came. */
async function walk(query: Record<string, string | number>, between: (step: number) => Promise<unknown>): Promise<string[]> {
  const seen: string[] = []
  let list = await page({ ...query, pageSize: 3 })
  for (let step = 1; ; step++) {
    seen.push(...list.exams.map((e) => e.id))
    if (!list.nextCursor) return seen
    await between(step)
    list = await page({ ...query, pageSize: 3, page: step + 1, cursor: list.nextCursor })
  }
}

const SORTS = ExamSortSchema.options.flatMap((sort) => (['asc', 'desc'] as const).map((order) => [sort, order] as const))

// These only read: one set of ten exams serves every sort.
describe('GET /api/exams with a cursor (keyset paging), reading the same ten exams', () => {
  beforeAll(async () => {
    await freshApp()
    await recordTen()
  })

  it.each(SORTS)('by %s %s, pages through every exam once, in the order of a single page', async (sort, order) => {
    const whole = (await page({ sort, order, pageSize: 200 })).exams.map((e) => e.id)

    const paged = await walk({ sort, order }, async () => undefined)

    expect(paged).toEqual(whole)
  })
})

describe('GET /api/exams with a cursor (keyset paging)', () => {
  beforeEach(freshApp)

  it.each(SORTS.filter(([sort]) => sort !== 'updatedAt'))(
    'by %s %s, while exams are added and others change between pages, skips and repeats none of those there at the start',
    async (sort, order) => {
      const exams = await recordTen()
      const whole = (await page({ sort, order, pageSize: 200 })).exams.map((e) => e.id)

      const drafts = exams.filter((e) => e.status === 'draft')

      const paged = await walk({ sort, order }, async (step) => {
        await recordExam(app, auth, { teamId, examinedAt: at(step % 4), patientCode: `SM-${step % 3}` })
        const draft = drafts[step % drafts.length]!
        await changeNotes(draft.id, `changed at step ${step}`)
      })

      expect(paged.filter((id) => whole.includes(id))).toEqual(whole)
      expect(new Set(paged).size).toBe(paged.length)
    },
  )

  // By last change, a change moves the exam: newest first it lands among the pages already read; oldest first, at the end.
  it('by updatedAt, an exam changed between pages moves to its new place and every other exam comes once', async () => {
    const exams = await recordTen()
    const whole = (await page({ sort: 'updatedAt', order: 'desc', pageSize: 200 })).exams.map((e) => e.id)
    const changed = exams.find((e) => e.status === 'draft' && whole.indexOf(e.id) > 5)!

    const paged = await walk({ sort: 'updatedAt', order: 'desc' }, async (step) => {
      if (step === 1) await changeNotes(changed.id, 'changed')
    })

    expect(paged).toEqual(whole.filter((id) => id !== changed.id))
  })

  it('carries the count of the first page on, so deeper pages need not count again', async () => {
    await recordTen()
    const first = await page({ pageSize: 3 })
    await recordExam(app, auth, { teamId })

    const second = await page({ pageSize: 3, page: 2, cursor: first.nextCursor! })

    expect(first.total).toBe(10)
    expect(second.total).toBe(10)
    expect(second.totalCapped).toBe(false)
  })

  it('counts up to 10,000 and says when more match, and the cursor still reaches past them', async () => {
    const [exam] = await recordTen()
    await copyExam(exam!.id, EXAM_COUNT_CAP)

    const first = await page({ pageSize: 200, sort: 'examinedAt', order: 'asc' })
    const deep = await page({ pageSize: 200, page: 2, sort: 'examinedAt', order: 'asc', cursor: first.nextCursor! })

    expect(first.total).toBe(EXAM_COUNT_CAP)
    expect(first.totalCapped).toBe(true)
    expect(deep.totalCapped).toBe(true)
    expect(deep.exams.map((e) => e.id)).not.toContain(first.exams[0]!.id)
    expect(deep.exams).toHaveLength(200)
  })

  it('answers no next cursor on the last page', async () => {
    await recordTen()

    const list = await page({ pageSize: 10 })

    expect(list.exams).toHaveLength(10)
    expect(list.nextCursor).toBeNull()
  })

  it('when the cursor came from another sort, responds 400 naming the cursor', async () => {
    await recordTen()
    const { nextCursor } = await page({ pageSize: 3, sort: 'examinedAt' })

    const res = await request(app).get('/api/exams').set('Authorization', auth).query({ pageSize: 3, sort: 'cvpCmH2O', cursor: nextCursor })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('cursor')
  })

  it('when the cursor is not one the server made, responds 400 naming the cursor', async () => {
    const res = await request(app).get('/api/exams').set('Authorization', auth).query({ cursor: 'not-a-cursor' })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('cursor')
  })

  it('when a page number reaches past the counted exams without a cursor, responds 400 naming the page', async () => {
    const res = await request(app).get('/api/exams').set('Authorization', auth).query({ page: 401, pageSize: 25 })

    expect(res.status).toBe(400)
    expect(res.body.error.fields).toHaveProperty('page')
  })
})

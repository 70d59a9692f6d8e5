import pg from 'pg'
import { QueryTypes, Sequelize } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { openDatabase } from '../../../server/db/sequelize.ts'
import { isPostgres } from '../database-kind.ts'
import { sharedTestDatabase } from '../helpers.ts'
import { exam, seedRows } from './seed-rows.ts'

const WRITERS = 12
const EXAMS_PER_WRITER = 8

let writers: Sequelize
let reader: Sequelize

/** Yields to the event loop a random number of times, so the writers' transactions end in an order of their own. */
async function wander(): Promise<void> {
  for (let i = Math.floor(Math.random() * 20); i > 0; i -= 1) await new Promise((resolve) => setImmediate(resolve))
}

/** One writer: transactions that each insert an exam, or change an earlier one, and commit after a while. */
async function write(writer: number): Promise<void> {
  for (let i = 0; i < EXAMS_PER_WRITER; i += 1) {
    await writers.transaction(async (transaction) => {
      const id = `exam-w${writer}-${i}`
      await writers.getQueryInterface().bulkInsert('exams', [exam(id, 'user-resident', i)], { transaction })
      await wander()
      if (i > 0) await writers.query(`UPDATE "exams" SET "notes" = 'changed' WHERE "id" = 'exam-w${writer}-${i - 1}'`, { transaction })
      await wander()
    })
  }
}

/** What a device's pull does: the changes after its cursor, in cursor order; the cursor moves to the last one. */
async function pull(cursor: number): Promise<number[]> {
  const rows = await reader.query<{ syncSeq: number }>(`SELECT "syncSeq" FROM "exams" WHERE "syncSeq" > :cursor ORDER BY "syncSeq"`, {
    replacements: { cursor },
    type: QueryTypes.SELECT,
  })
  return rows.map((r) => Number(r.syncSeq))
}

// On SQLite one writer at a time numbers the changes (sqlite-schema.ts); this is about PostgreSQL's writers side by side.
describe.runIf(isPostgres)('the sync cursor on PostgreSQL, with writers side by side', () => {
  beforeAll(async () => {
    const location = await sharedTestDatabase('')
    // Two pools, as two app servers would have: the writers' transactions side by side, the reader on its own.
    writers = new Sequelize(location, { dialect: 'postgres', dialectModule: pg, logging: false, pool: { max: WRITERS } })
    reader = openDatabase(location)
    await seedRows(writers.getQueryInterface())
  })

  afterAll(async () => {
    await writers.close()
    await reader.close()
  })

  it('a reader pulling while they commit never sees a number appear below one it has passed', async () => {
    let cursor = 0
    const seen: number[] = []
    let writing = true
    const done = Promise.all(Array.from({ length: WRITERS }, (_, w) => write(w))).finally(() => (writing = false))
    while (writing) {
      const got = await pull(cursor)
      seen.push(...got)
      cursor = got.at(-1) ?? cursor
    }
    await done
    seen.push(...(await pull(cursor)))

    const stored = await reader.query<{ syncSeq: number }>(`SELECT "syncSeq" FROM "exams"`, { type: QueryTypes.SELECT })
    const current = stored.map((r) => Number(r.syncSeq)).sort((a, b) => a - b)
    // Every row's current number was pulled: none committed below a cursor the reader had already moved past.
    expect(current.filter((n) => !seen.includes(n))).toEqual([])
    expect(current).toHaveLength(3 + WRITERS * EXAMS_PER_WRITER)
  })
})

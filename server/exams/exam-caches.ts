import { QueryTypes, type Sequelize } from 'sequelize'
import type { Exam } from '#shared/schemas/exam'
import { answerCache, type AnswerCache } from '../http/answer-cache.ts'
import { ttlLru, type TtlLru } from '../http/ttl-lru.ts'
import { ExamModel } from '../models/index.ts'
import { quoteName } from '../db/quote.ts'
import { serverTimeZone } from '../supervision/time-zone.ts'

/**
 * How long a cached exam or answer is served: what the keys cannot see (a signature row written behind the
 * application's back, which the table's triggers refuse anyway) shows within this time. Product default, no published source.
 */
export const EXAM_CACHE_TTL_MS = 5_000
/** About 2 KB each: some 25 MB at most. */
const MAX_EXAMS = 12_000
const MAX_ANSWER_BYTES = 32 * 1024 * 1024

export interface ExamCaches {
  /** Each exam as presented, by `viewKey`. */
  views: TtlLru<Exam>
  /** Whole answers of the exam log and the sync pull, compressed. */
  answers: AnswerCache
}

// One set per database, so that a server (or a test) on another database never reads this one's entries.
const byDatabase = new WeakMap<Sequelize, ExamCaches>()

export function examCaches(): ExamCaches {
  const database = ExamModel.sequelize!
  let caches = byDatabase.get(database)
  if (!caches) {
    caches = {
      views: ttlLru<Exam>({ maxWeight: MAX_EXAMS, ttlMs: EXAM_CACHE_TTL_MS }),
      answers: answerCache({ maxBytes: MAX_ANSWER_BYTES, ttlMs: EXAM_CACHE_TTL_MS }),
    }
    byDatabase.set(database, caches)
  }
  return caches
}

/** Empties the current database's caches: for tests that change rows behind the application's back. */
export function clearExamCaches(): void {
  const caches = byDatabase.get(ExamModel.sequelize!)
  caches?.views.clear()
  caches?.answers.clear()
}

export interface ExamDataVersion {
  /** The last exam change: any exam inserted or changed. */
  exams: string
  /** What an exam's presentation takes from elsewhere: user and team names, the time zone signature times are shown in. */
  names: string
}

const [exams, users, teams, seq, updated] = ['exams', 'users', 'teams', 'syncSeq', 'updatedAt'].map(quoteName)

/**
 * What changes with every write the exam answers show, as three text columns of one SQL row (`e`, `u`, `t`): any exam
 * inserted or changed (its `syncSeq`, set by the database's triggers, also on a change made behind the application's
 * back; a countersignature and its superseding are always written with their exam), a user or team renamed. An index
 * read and two reads of small tables; text on both databases, so the columns can join a UNION (users/auth-state.ts).
 */
export const DATA_VERSION_COLUMNS = [
  `CAST((SELECT MAX(${seq}) FROM ${exams}) AS TEXT)`,
  `CAST((SELECT MAX(${updated}) FROM ${users}) AS TEXT)`,
  `CAST((SELECT MAX(${updated}) FROM ${teams}) AS TEXT)`,
] as const

/** The version of the three columns of DATA_VERSION_COLUMNS, with the time zone signature times are shown in. */
export function dataVersionOf(exams: string | null, users: string | null, teams: string | null): ExamDataVersion {
  return { exams: exams ?? '', names: [users ?? '', teams ?? '', serverTimeZone()].join('|') }
}

/** The data version on its own, for a reader whose request did not read it with the account (middleware/auth.ts). */
export async function examDataVersion(): Promise<ExamDataVersion> {
  const sql = `SELECT ${DATA_VERSION_COLUMNS.map((column, i) => `${column} AS ${quoteName('eut'[i]!)}`).join(', ')}`
  const [row] = await ExamModel.sequelize!.query<Record<'e' | 'u' | 't', string | null>>(sql, { type: QueryTypes.SELECT })
  return dataVersionOf(row?.e ?? null, row?.u ?? null, row?.t ?? null)
}

/** Where a read path keeps presented exams, and what besides the row its presentation depends on (names, time zone, mask). */
export interface PageCache {
  views: TtlLru<Exam>
  context: string
}

/**
 * An exam as one kind of reader sees it: the row's id and change counter (every write to the row moves it), the
 * patient code shown or masked (masked readers also lose the free text), and the cache's context.
 */
export const viewKey = (row: ExamModel, masked: boolean, context: string) =>
  `${row.id}|${row.syncSeq}|${masked ? 'masked' : 'clinical'}|${context}`

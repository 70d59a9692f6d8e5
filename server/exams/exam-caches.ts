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

const asText = (value: unknown) => (value instanceof Date ? value.toISOString() : String(value ?? ''))

export interface ExamDataVersion {
  /** The last exam change: any exam inserted or changed. */
  exams: string
  /** What an exam's presentation takes from elsewhere: user and team names, the time zone signature times are shown in. */
  names: string
}

/**
 * What changes with every write the exam answers show: any exam inserted or changed (its `syncSeq`, set by the
 * database's triggers, also on a change made behind the application's back; a countersignature and its superseding
 * are always written with their exam), a user or team renamed, the server's time zone. An index read and two reads
 * of small tables.
 */
export async function examDataVersion(): Promise<ExamDataVersion> {
  const [exams, users, teams, seq, updated] = ['exams', 'users', 'teams', 'syncSeq', 'updatedAt'].map(quoteName)
  const sql = `SELECT (SELECT MAX(${seq}) FROM ${exams}) AS e, (SELECT MAX(${updated}) FROM ${users}) AS u, (SELECT MAX(${updated}) FROM ${teams}) AS t`
  const [row] = await ExamModel.sequelize!.query<Record<'e' | 'u' | 't', unknown>>(sql, { type: QueryTypes.SELECT })
  return { exams: asText(row?.e), names: [row?.u, row?.t, serverTimeZone()].map(asText).join('|') }
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

import { QueryTypes, type Sequelize } from 'sequelize'
import { ExamModel } from '../models/index.ts'
import { loadExaminers, type Examiner } from './examiners.ts'
import { PairBook } from './pair-book.ts'
import { changedPatientCodes, countReadings, loadReadings } from './pair-source.ts'
import type { Pair, PairingOptions } from './pairs.ts'
import { currentSettings } from '../settings/settings.service.ts'

export interface ProgramPairs {
  pairs: readonly Pair[]
  examiners: Map<string, Examiner>
}

interface Built {
  fingerprint: string
  windowMinutes: number
  /** Server time just before the database was last read; changes are looked up from there. */
  readAt: number
  rebuiltAt: number
  book: PairBook
  examiners: Map<string, Examiner>
}

/** A safety net for writes that bypass updatedAt: everything is read again after this long. */
const REBUILD_AFTER_MS = 10 * 60_000
const MAX_CHANGED_PATIENTS = 1_000
// updatedAt is stamped before a write commits; looking back this far also catches a transaction that committed late.
const CHANGE_MARGIN_MS = 60_000
const cache = new WeakMap<Sequelize, Promise<Built | undefined>>()

// Any committed write changes one of these: total_changes() counts this connection's own writes, and data_version
// moves when another connection commits (Sequelize gives each SQLite transaction a connection of its own).
async function fingerprintOf(sequelize: Sequelize): Promise<string> {
  const sql = 'SELECT total_changes() AS changes, data_version AS version FROM pragma_data_version'
  const [row] = await sequelize.query<{ changes: number; version: number }>(sql, { type: QueryTypes.SELECT })
  return `${row?.changes}/${row?.version}`
}

const optionsFor = (windowMinutes: number, examiners: Map<string, Examiner>): PairingOptions => ({
  windowMinutes,
  isAttending: (id) => examiners.get(id)?.role === 'attending',
})
const sameRoles = (a: Map<string, Examiner>, b: Map<string, Examiner>) =>
  a.size === b.size && [...a].every(([id, examiner]) => b.get(id)?.role === examiner.role)

async function rebuild(fingerprint: string, windowMinutes: number): Promise<Built> {
  const readAt = Date.now()
  const [examiners, readings] = await Promise.all([loadExaminers(), loadReadings()])
  const book = PairBook.of(readings, optionsFor(windowMinutes, examiners))
  return { fingerprint, windowMinutes, readAt, rebuiltAt: readAt, book, examiners }
}

/** Pairs again only the patients whose exams changed since the last read; null when reading everything is safer. */
async function catchUp(previous: Built, fingerprint: string): Promise<Built | null> {
  const readAt = Date.now()
  const examiners = await loadExaminers()
  if (!sameRoles(previous.examiners, examiners)) return null
  const codes = await changedPatientCodes(new Date(previous.readAt - CHANGE_MARGIN_MS))
  if (codes.length > MAX_CHANGED_PATIENTS) return null
  const [readings, count] = await Promise.all([loadReadings(codes), countReadings()])
  const book = previous.book.with(codes, readings, optionsFor(previous.windowMinutes, examiners))
  // A deleted exam leaves no updatedAt behind; the count then gives it away.
  return book.readings.length === count ? { ...previous, fingerprint, readAt, book, examiners } : null
}

async function refresh(previous: Built | undefined, fingerprint: string, windowMinutes: number): Promise<Built> {
  const usable = previous && previous.windowMinutes === windowMinutes && Date.now() - previous.rebuiltAt < REBUILD_AFTER_MS
  if (usable && previous.fingerprint === fingerprint) return previous
  return (usable && (await catchUp(previous, fingerprint))) || rebuild(fingerprint, windowMinutes)
}

/**
 * Every pair of the program, with everyone who examined. Dashboards ask again and again with other filters, so the
 * pairs are kept per database and brought up to date on each call: untouched, they are reused; after a few writes
 * only the patients concerned are paired again. Calls queue behind one another, so concurrent ones build once.
 * The window is the admin's setting (§6) unless the caller names one; pairs built with another window are rebuilt.
 */
export async function programPairs(requestedWindow?: number): Promise<ProgramPairs> {
  const sequelize = ExamModel.sequelize!
  const windowMinutes = requestedWindow ?? (await currentSettings()).values.pairWindowMinutes
  // Taken before reading, so a write that lands in between makes the next call look again rather than trust stale pairs.
  const fingerprint = await fingerprintOf(sequelize)
  const previous = (cache.get(sequelize) ?? Promise.resolve(undefined)).catch(() => undefined)
  const next = previous.then((built) => refresh(built, fingerprint, windowMinutes))
  cache.set(sequelize, next)
  const { book, examiners } = await next
  return { pairs: book.pairs, examiners }
}

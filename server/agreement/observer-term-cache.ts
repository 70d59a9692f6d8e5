import type { Sequelize } from 'sequelize'
import type { ObserverTerm } from '#shared/schemas/exam'
import { ExamModel } from '../models/index.ts'
import { latestSettingsVersion } from '../settings/settings.service.ts'

/** A computed term and the inputs it was computed from. */
export interface HeldTerm {
  term: ObserverTerm
  inputs: string
  computedAt: number
}

export interface TermCache {
  held: HeldTerm | null
  pending: { generation: number; inputs: string; term: Promise<ObserverTerm> } | null
  /** Moved by a local invalidation: a computation begun before it is not kept. */
  generation: number
}

// Per database, so each test's fresh database computes its own term.
const caches = new WeakMap<Sequelize, TermCache>()

export function termCacheOf(sequelize: Sequelize): TermCache {
  let cache = caches.get(sequelize)
  if (!cache) caches.set(sequelize, (cache = { held: null, pending: null, generation: 0 }))
  return cache
}

/**
 * What the local error term is computed from, as one text that changes whenever that does, through whichever app
 * server: the newest sync cursor of the exams, which every exam write moves in its own transaction (the pairs are derived
 * and a closing round touches its entries in such writes), and the newest settings version (the pairing window and the
 * default term). Each is the end of an index, one row read. Role changes (which examiner counts as the attending) and
 * the sliding 365-day window are left to the cache's maximum age.
 */
export async function observerTermInputs(): Promise<string> {
  const [cursor, settings] = await Promise.all([ExamModel.max('syncSeq'), latestSettingsVersion()])
  return `${Number(cursor ?? 0)}:${settings}`
}

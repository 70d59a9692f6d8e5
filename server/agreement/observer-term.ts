import { defaultObserverTerm } from '#shared/domain/estimate'
import { localTermFromPairs, localTermFromRounds } from '#shared/domain/observer-term'
import type { ObserverTerm } from '#shared/schemas/exam'
import { closedRoundSubjects, onRoundClose } from '../rounds/rounds.service.ts'
import { currentSettings, onSettingsChange } from '../settings/settings.service.ts'
import { pairTime } from './agreement-scope.ts'
import type { Pair } from './pairs.ts'
import { programPairs } from './pair-store.ts'
import { isPoint, pointHeight } from './reading-categories.ts'

/** Rounds and pairs older than this no longer describe the deployment's examiners (product default). */
export const OBSERVER_LOOKBACK_DAYS = 365
/** A routine pair counts only when its two inclinations differ by at most this (degrees): else posture, not reading, differs. */
export const PAIR_MAX_INCLINATION_DIFF_DEG = 5
/** A cached term is recomputed after this long even if nothing invalidated it. */
export const OBSERVER_TERM_MAX_AGE_MS = 10 * 60_000

const DAY_MS = 86_400_000

let cached: { term: ObserverTerm; computedAt: number } | null = null
let pending: { generation: number; term: Promise<ObserverTerm> } | null = null
let generation = 0

const comparable = (p: Pair) =>
  isPoint(p.first) && isPoint(p.second) && Math.abs(p.first.inclinationDeg - p.second.inclinationDeg) <= PAIR_MAX_INCLINATION_DIFF_DEG

/**
 * The height differences of the routine pairs of the window with a measured height on both sides (a bound has no
 * difference to take), their two exams taken at (nearly) the same inclination.
 */
async function pairDifferences(since: number, now: number): Promise<number[]> {
  const { pairs } = await programPairs()
  const kept = pairs.filter((p) => pairTime(p) >= since && pairTime(p) <= now && comparable(p))
  return kept.map((p) => pointHeight(p.first) - pointHeight(p.second))
}

async function compute(now: number): Promise<ObserverTerm> {
  const since = now - OBSERVER_LOOKBACK_DAYS * DAY_MS
  const fromRounds = localTermFromRounds(await closedRoundSubjects(new Date(since)))
  if (fromRounds) return fromRounds
  const fromPairs = localTermFromPairs(await pairDifferences(since, now))
  return fromPairs ?? defaultObserverTerm((await currentSettings()).values.estimate)
}

/**
 * The error term every new estimate uses. A local σ_exam, replacing reading and observer error together, from (a) the
 * calibration rounds closed in the last 365 days, pooled within-subject SD over their complete subjects, once there
 * are 30 (`local-rounds`); else (b) the routine pairs of the last 365 days whose inclinations differ by ≤ 5°, SD of
 * the differences ÷ √2, once there are 30 (`local-pairs`); else the settings' default (`default`). Cached for
 * OBSERVER_TERM_MAX_AGE_MS or until {@link invalidateObserverTerm}; concurrent callers share one computation.
 */
export async function observerTerm(): Promise<ObserverTerm> {
  const now = Date.now()
  if (cached && now - cached.computedAt < OBSERVER_TERM_MAX_AGE_MS) return cached.term
  if (pending?.generation === generation) return pending.term
  const mine = { generation, term: compute(now) }
  pending = mine
  try {
    const term = await mine.term
    if (mine.generation === generation) cached = { term, computedAt: now }
    return term
  } finally {
    if (pending === mine) pending = null
  }
}

/** Drops the cached term, e.g. after an exam is submitted or a round closes; the next call recomputes it. */
export function invalidateObserverTerm(): void {
  generation += 1
  cached = null
}

// A new pairing window changes the pairs, a new default σ_observer the default term; a closed round adds subjects.
onSettingsChange(invalidateObserverTerm)
onRoundClose(invalidateObserverTerm)

import type { ObserverTerm } from '#shared/domain/estimate'
import { DEFAULT_ESTIMATE_SETTINGS } from '#shared/schemas/settings'
import { blandAltman } from '#shared/stats/index'
import { pairTime } from './agreement-scope.ts'
import { onSettingsChange } from '../settings/settings.service.ts'
import { programPairs } from './pair-store.ts'

/** §4.4: the local spread replaces the default once the deployment holds this many pairs from the last year. */
export const LOCAL_OBSERVER_MIN_PAIRS = 30
export const OBSERVER_LOOKBACK_DAYS = 365
/** A cached term is recomputed after this long even if nothing invalidated it. */
export const OBSERVER_TERM_MAX_AGE_MS = 10 * 60_000

const DAY_MS = 86_400_000
const DEFAULT_TERM: ObserverTerm = { sigmaCm: DEFAULT_ESTIMATE_SETTINGS.sigmaObserverCm, source: 'default' }

let cached: { term: ObserverTerm; computedAt: number } | null = null
let pending: { generation: number; term: Promise<ObserverTerm> } | null = null
let generation = 0

async function compute(now: number): Promise<ObserverTerm> {
  const since = now - OBSERVER_LOOKBACK_DAYS * DAY_MS
  const { pairs } = await programPairs()
  const recent = pairs.filter((p) => pairTime(p) >= since && pairTime(p) <= now)
  if (recent.length < LOCAL_OBSERVER_MIN_PAIRS) return DEFAULT_TERM
  const spread = blandAltman(
    recent.map((p) => p.first.heightCm),
    recent.map((p) => p.second.heightCm),
  )
  // Each difference carries two observers' errors: SD(d) = √2·σ_observer.
  return spread.ok ? { sigmaCm: spread.sd / Math.SQRT2, source: 'local' } : DEFAULT_TERM
}

/**
 * σ_observer for the estimate (§4.4): SD of the pair differences ÷ √2 from the last 365 days once there are at least
 * 30 pairs (`source: 'local'`), else the settings' default (`source: 'default'`). Cached for
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

/** Drops the cached term, e.g. after an exam is submitted, amended or deleted; the next call recomputes it. */
export function invalidateObserverTerm(): void {
  generation += 1
  cached = null
}

// A new pairing window changes the pairs the term is computed from.
onSettingsChange(invalidateObserverTerm)

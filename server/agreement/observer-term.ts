import { col, literal, Op } from 'sequelize'
import { defaultObserverTerm } from '#shared/domain/estimate'
import { localTermFromPairs, localTermFromRounds } from '#shared/domain/observer-term'
import type { ObserverTerm } from '#shared/schemas/exam'
import { quoteName } from '../db/quote.ts'
import { AgreementPairModel } from '../models/index.ts'
import { closedRoundSubjects, onRoundClose } from '../rounds/rounds.service.ts'
import { currentSettings, onSettingsChange } from '../settings/settings.service.ts'
import { observerTermInputs, termCacheOf } from './observer-term-cache.ts'
import { POINT_PAIRS } from './agreement-scope.ts'
import { attendingIdsOf, loadExaminers } from './examiners.ts'
import { differenceSql, flipsSql } from './orientation-sql.ts'

/** Rounds and pairs older than this no longer describe the deployment's examiners (product default). */
export const OBSERVER_LOOKBACK_DAYS = 365
/** A routine pair counts only when its two inclinations differ by at most this (degrees): else posture, not reading, differs. */
export const PAIR_MAX_INCLINATION_DIFF_DEG = 5
/** A cached term is recomputed after this long even if nothing invalidated it. */
export const OBSERVER_TERM_MAX_AGE_MS = 10 * 60_000

const DAY_MS = 86_400_000

const [earlierInclination, laterInclination] = [quoteName('earlierInclinationDeg'), quoteName('laterInclinationDeg')]

/**
 * The height differences (first − second) of the routine pairs of the window with a measured height on both sides (a
 * bound has no difference to take), their two exams taken at (nearly) the same inclination. Asked for as each distinct
 * difference with its count: heights are read to a few decimals, so a handful of rows stand for thousands of pairs.
 */
async function pairDifferences(since: number, now: number): Promise<number[]> {
  const difference = differenceSql(flipsSql(AgreementPairModel.sequelize!, attendingIdsOf(await loadExaminers())))
  const comparable = literal(`ABS(${earlierInclination} - ${laterInclination}) <= ${PAIR_MAX_INCLINATION_DIFF_DEG}`)
  const rows = (await AgreementPairModel.findAll({
    attributes: [[literal(difference), 'difference'], [literal('COUNT(*)'), 'n']],
    where: { [Op.and]: [POINT_PAIRS, { pairedAt: { [Op.between]: [new Date(since), new Date(now)] } }, comparable] },
    group: [col('difference')],
    raw: true,
  })) as unknown as { difference: number | string; n: number | string }[]
  return rows.flatMap((row) => new Array<number>(Number(row.n)).fill(Number(row.difference)))
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
 * OBSERVER_TERM_MAX_AGE_MS while its inputs (observer-term-cache.ts) stay as they were, so a change saved through any
 * app server on the database is used by every one from its next call; concurrent callers share one computation.
 */
export async function observerTerm(): Promise<ObserverTerm> {
  const cache = termCacheOf(AgreementPairModel.sequelize!)
  const now = Date.now()
  // Read before computing: a change committed meanwhile moves the inputs, and the next call computes again.
  const inputs = await observerTermInputs()
  const { held, pending, generation } = cache
  if (held?.inputs === inputs && now - held.computedAt < OBSERVER_TERM_MAX_AGE_MS) return held.term
  if (pending?.generation === generation && pending.inputs === inputs) return pending.term
  const mine = { generation, inputs, term: compute(now) }
  cache.pending = mine
  try {
    const term = await mine.term
    if (mine.generation === cache.generation) cache.held = { term, inputs, computedAt: now }
    return term
  } finally {
    if (cache.pending === mine) cache.pending = null
  }
}

/** Drops this server's cached term at once (other servers see the change through its inputs); the next call recomputes. */
export function invalidateObserverTerm(): void {
  const sequelize = AgreementPairModel.sequelize
  if (!sequelize) return
  const cache = termCacheOf(sequelize)
  cache.generation += 1
  cache.held = null
}

// A new pairing window changes the pairs, a new default σ_observer the default term; a closed round adds subjects.
onSettingsChange(invalidateObserverTerm)
onRoundClose(invalidateObserverTerm)

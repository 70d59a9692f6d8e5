import type { Estimate, Prompt } from '../schemas/exam.ts'
import { DEFAULT_ESTIMATE_SETTINGS, type EstimateSettings } from '../schemas/settings.ts'
import { oneDp, shortNumber } from './number-text.ts'

/** "a", "a or b", "a, b or c". */
export function orList(items: readonly string[]): string {
  if (items.length < 2) return items.join('')
  return `${items.slice(0, -1).join(', ')} or ${items.at(-1)}`
}

/** The categories the band reaches, in words: "high", "normal or high", "low, normal or high"; null without any. */
export function categoryStatement(e: Pick<Estimate, 'categories'>): string | null {
  return e.categories.length ? orList(e.categories) : null
}

/**
 * The primary bedside statement (McGee 1998, Am Heart J 136:10–18), with the threshold of the settings the estimate
 * was computed with (the defaults when omitted); null without an estimate.
 */
export function elevatedStatement(e: Pick<Estimate, 'elevated' | 'bound' | 'heightCm'>, settings?: EstimateSettings): string | null {
  const rule = `${shortNumber((settings ?? DEFAULT_ESTIMATE_SETTINGS).elevatedAboveCm)} cm above the sternal angle`
  if (e.elevated === true) return `JVP elevated (more than ${rule})`
  if (e.elevated === false && e.bound === 'upper') return 'JVP not elevated (no column even lying flat)'
  if (e.elevated === false) return `JVP not elevated (not more than ${rule})`
  if (e.bound === 'lower' && e.heightCm !== null)
    return `JVP at least ${oneDp(e.heightCm)} cm above the sternal angle: whether it is elevated (more than ${rule}) cannot be told`
  return null
}

/** Where the error term came from: the default terms, or a local σ_exam with its n and 95% CI. */
export function observerStatement(e: Pick<Estimate, 'observerSource' | 'observerSigmaCm' | 'observerN' | 'observerSigmaCi'>): string {
  if (e.observerSource === 'default') return 'default error terms'
  const from = e.observerSource === 'local-rounds' ? 'subjects of calibration rounds' : 'routine paired exams'
  const n = e.observerN === null ? from : `${e.observerN} ${from}`
  const sigma = e.observerSigmaCm === null ? '' : `: σ ${oneDp(e.observerSigmaCm)} cm`
  const ci = e.observerSigmaCi ? ` (95% CI ${oneDp(e.observerSigmaCi[0])}–${oneDp(e.observerSigmaCi[1])})` : ''
  return `local error term from ${n}${sigma}${ci}`
}

/** A prompt labelled as such, with its differential and any query; never worded as a diagnosis. */
export function promptStatement(p: Prompt): string {
  const query = p.query ? ` Query: ${p.query}` : ''
  return `Prompt from Plumbline (not a finding): ${p.finding}; consider ${orList(p.differential)}.${query}`
}

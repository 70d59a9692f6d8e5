import { computeEstimate, type ObserverTerm } from '#shared/domain/estimate'
import type { Estimate, ExamFindings } from '#shared/schemas/exam'
import type { EstimateSettings } from '#shared/schemas/settings'
import { observerTerm } from '../agreement/observer-term.ts'
import { currentSettings } from './settings.service.ts'

/** What a new estimate is computed with: the settings in force, their version, and the local observer spread if any. */
export interface EstimateContext {
  settings: EstimateSettings
  settingsVersion: number
  /** Only a local term (§4.4); otherwise the settings' default observer error applies. */
  observer?: ObserverTerm
}

/** Read once before a write transaction: both come from other rows than the one being written. */
export async function estimateContext(): Promise<EstimateContext> {
  const [current, observer] = await Promise.all([currentSettings(), observerTerm()])
  return {
    settings: current.values.estimate,
    settingsVersion: current.version,
    observer: observer.source === 'local' ? observer : undefined,
  }
}

/** The estimate of the findings under the context's settings, stamped with their version so it can later say what it used. */
export function estimateWith(findings: ExamFindings, context: EstimateContext): Estimate {
  return { ...computeEstimate(findings, { settings: context.settings, observer: context.observer }), settingsVersion: context.settingsVersion }
}

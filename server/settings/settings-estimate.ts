import { computeEstimate } from '#shared/domain/estimate'
import type { EstimateV2, ExamFindings, ObserverTerm } from '#shared/schemas/exam'
import type { EstimateSettings, SettingsInForce } from '#shared/schemas/settings'
import { observerTerm } from '../agreement/observer-term.ts'
import { currentSettings } from './settings.service.ts'

/** What a new estimate is computed with: the settings in force, their version, and the error term in force. */
export interface EstimateContext {
  settings: EstimateSettings
  settingsVersion: number
  /** The local error term, or the settings' default one; always the term `GET /api/settings` gives devices. */
  observer: ObserverTerm
}

/** Read once before a write transaction: both come from other rows than the one being written. */
export async function estimateContext(): Promise<EstimateContext> {
  const [current, observer] = await Promise.all([currentSettings(), observerTerm()])
  return { settings: current.values.estimate, settingsVersion: current.version, observer }
}

/** The estimate of the findings under the context's settings, stamped with their version so it can later say what it used. */
export function estimateWith(findings: ExamFindings, context: EstimateContext): EstimateV2 {
  return { ...computeEstimate(findings, { settings: context.settings, observer: context.observer }), settingsVersion: context.settingsVersion }
}

/** The settings in force with the error term the server will use, so a device computes the band the server stores. */
export async function settingsInForce(): Promise<SettingsInForce> {
  const [current, observer] = await Promise.all([currentSettings(), observerTerm()])
  return { ...current, observerTerm: observer }
}

import type { Exam } from '#shared/schemas/exam'
import type { EstimateSettings } from '#shared/schemas/settings'
import { settingsVersion } from '../settings/settings.service.ts'

/** The settings version an estimate was computed with; an estimate without one predates versioned settings (version 1). */
export const versionOf = (exam: Exam) => exam.estimate.settingsVersion ?? 1

/** The estimate settings of each version the exams' estimates used, so each statement uses the threshold it was saved with. */
export async function estimateSettingsOf(exams: readonly Exam[]): Promise<Map<number, EstimateSettings>> {
  const versions = [...new Set(exams.map(versionOf))]
  const found = await Promise.all(versions.map((v) => settingsVersion(v).then((s) => [v, s.values.estimate] as const, () => null)))
  return new Map(found.filter((entry) => entry !== null))
}

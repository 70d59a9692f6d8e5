import { categoryStatement, elevatedStatement } from '#shared/domain/estimate-text'
import { bandText } from '#shared/domain/exam-note'
import type { Caution, Estimate, ObserverSource } from '#shared/schemas/exam'
import type { EstimateSettings } from '#shared/schemas/settings'

/** What an export says about an estimate in words, beside its numbers; prompts are never among them. */
export interface EstimateStatements {
  /** "JVP elevated (more than 3 cm above the sternal angle)" or "JVP not elevated …"; null without an estimate. */
  elevated: string | null
  /** The categories the band reaches in words ("normal or high"); null without an estimate. */
  category: string | null
  /** The arterial-evidence caution, which always comes first. */
  arterialWarning: string | null
  /** Why "elevated" and the category disagree: the 3 cm rule's frame against the CT-derived offset. */
  frameNote: string | null
  /** Every other measurement caution (left-sided vein, context flags, inclination beyond the studied range…). */
  otherCautions: string[]
  /** Both bands in words when the band the examiner reviewed differs from the one stored. */
  reviewedNote: string | null
}

const SOURCE_TEXT: Record<ObserverSource, string> = {
  default: 'default error terms',
  'local-pairs': 'local error term from routine pairs',
  'local-rounds': 'local error term from calibration rounds',
}

const textOf = (cautions: Caution[], code: Caution['code']) => cautions.find((c) => c.code === code)?.text ?? null
const SEPARATE = new Set<Caution['code']>(['arterial-evidence', 'frame-disagreement'])

function reviewedNote(e: Estimate): string | null {
  if (!e.reviewed) return null
  const band = (b: Estimate['bandCmH2O'], source: ObserverSource) => `${bandText(b) ?? 'no band'} cmH2O (${SOURCE_TEXT[source]})`
  return (
    `The band shown when the exam was reviewed was ${band(e.reviewed.bandCmH2O, e.reviewed.observerSource)}; ` +
    `the band saved is ${band(e.bandCmH2O, e.observerSource)}: the error term changed between review and saving.`
  )
}

/** The statements of a stored estimate of either rules version, as it was saved; `settings` are those it was computed with. */
export function statementsOf(e: Estimate, settings?: EstimateSettings): EstimateStatements {
  return {
    elevated: elevatedStatement(e, settings),
    category: categoryStatement(e),
    arterialWarning: textOf(e.cautions, 'arterial-evidence'),
    frameNote: textOf(e.cautions, 'frame-disagreement'),
    otherCautions: e.cautions.filter((c) => !SEPARATE.has(c.code)).map((c) => c.text),
    reviewedNote: reviewedNote(e),
  }
}

import { VenousSignSchema, type Exam, type VenousSignState } from '../schemas/exam.ts'
import type { EstimateSettings } from '../schemas/settings.ts'
import { NOT_ASSESSABLE_LABEL, RESPIRATORY_TEXT, RHYTHM_TEXT, VENOUS_SIGN_ABSENT_LABEL, VENOUS_SIGN_LABEL } from './exam-labels.ts'
import { categoryStatement, elevatedStatement, observerStatement } from './estimate-text.ts'
import { bandText, oneDp } from './number-text.ts'
import { abdominojugularPositive } from './prompts.ts'

function heightText(exam: Exam, heightCm: number): string {
  const where = heightCm < 0 ? `${oneDp(-heightCm)} cm below` : `${oneDp(heightCm)} cm above`
  const how = exam.heightMethod === 'along-neck' ? `${oneDp(exam.alongNeckCm ?? 0)} cm along the neck` : 'vertical rule'
  const precision = exam.readingPrecision === 'ruler' ? 'read with a ruler' : 'estimated by eye'
  return `${where} the sternal angle (${how}, ${precision})`
}

export function columnLine(exam: Exam): string {
  const h = exam.estimate.heightCm
  if (exam.columnTop === 'not-filled') return 'Column: not filled, even lying flat.'
  if (exam.columnTop === 'not-assessable' || h === null) {
    const reason = exam.notAssessableReason === 'other' ? exam.notAssessableText : exam.notAssessableReason && NOT_ASSESSABLE_LABEL[exam.notAssessableReason]
    return `Column: top could not be assessed${reason ? ` (${reason})` : ''}.`
  }
  if (exam.columnTop === 'above-neck') return `Column: top above the visible neck, at least ${heightText(exam, h)}.`
  return `Column: top ${heightText(exam, h)}.`
}

export function estimateLine({ bound, cvpCmH2O, cvpMmHg, bandCmH2O, bandMmHg }: Exam['estimate']): string {
  if (bound === 'none' || cvpCmH2O === null || cvpMmHg === null) return 'Estimated CVP: none (the column top was not measured).'
  const prefix = bound === 'lower' ? 'at least ' : bound === 'upper' ? 'at most ' : ''
  const band = bandText(bandCmH2O)
  const bandPart = band ? `; 95% band ${band} cmH₂O (${bandText(bandMmHg)} mmHg)` : ''
  return `Estimated CVP: ${prefix}${oneDp(cvpCmH2O)} cmH₂O (${oneDp(cvpMmHg)} mmHg)${bandPart}.`
}

export function modelLine(e: Exam['estimate']): string {
  const range = e.outsideStudiedRange ? ', held beyond the studied angles (above 60°)' : ''
  const rules = e.rulesVersion === 1 ? ' Computed under the first rules and shown as saved.' : ''
  return `Offset model: ${e.offsetModel}, ${oneDp(e.offsetCm)} cm sternal angle to right atrium${range}; ${observerStatement(e)}.${rules}`
}

export function interpretationLine(e: Exam['estimate'], settings?: EstimateSettings): string | null {
  const elevated = elevatedStatement(e, settings)
  const categories = categoryStatement(e)
  if (elevated === null && categories === null) return null
  const confidence = e.confidence === 'clear' ? 'clear: the band lies within one category' : 'indeterminate: the 95% band reaches more than one category'
  const category = categories === null ? [] : [`CVP category ${categories} (${confidence})`]
  return `Interpretation: ${[elevated ?? [], category].flat().join('; ')}.`
}

function signsIn(exam: Exam, state: VenousSignState): string[] {
  const label = state === 'absent' ? VENOUS_SIGN_ABSENT_LABEL : VENOUS_SIGN_LABEL
  return VenousSignSchema.options.filter((sign) => exam.venousSigns[sign] === state).map((sign) => label[sign])
}

export function venousSignsLine(exam: Exam): string {
  const present = signsIn(exam, 'present')
  const absent = signsIn(exam, 'absent')
  const untested = signsIn(exam, 'not-tested').length
  const parts = [`${present.length} of 6 present${present.length ? ` (${present.join(', ')})` : ''}`]
  if (absent.length) parts.push(`${absent.length} absent (${absent.join(', ')})`)
  if (untested) parts.push(`${untested} not tested`)
  const confirmed = exam.venousConfirmed ? ' The examiner confirmed the column is venous.' : ''
  return `Venous signs: ${parts.join('; ')}.${confirmed}`
}

function abdominojugularText(exam: Exam): string | null {
  const { done, riseCm, sustained, fallOnReleaseCm } = exam.abdominojugular
  if (!done) return null
  const rise = riseCm === undefined ? null : `rise ${oneDp(riseCm)} cm${sustained ? ', sustained' : ''}`
  const fall = fallOnReleaseCm === undefined ? null : `fall on release ${oneDp(fallOnReleaseCm)} cm`
  const detail = [rise, fall].filter(Boolean).join('; ')
  return `abdominojugular test ${abdominojugularPositive(exam) ? 'positive' : 'negative'}${detail ? ` (${detail})` : ''}`
}

export function findingsLine(exam: Exam): string | null {
  const { aWave, vWave, yDescent } = exam.waveform
  const parts = [
    RHYTHM_TEXT[exam.rhythm],
    aWave === 'unclear' || aWave === undefined ? null : `a wave ${aWave}`,
    vWave === 'unclear' || vWave === undefined ? null : `v wave ${vWave}`,
    yDescent === 'unclear' || yDescent === undefined ? null : `y descent ${yDescent}`,
    RESPIRATORY_TEXT[exam.respiratory],
    abdominojugularText(exam),
  ].filter((part) => part !== null)
  return parts.length ? `Findings: ${parts.join('; ')}.` : null
}

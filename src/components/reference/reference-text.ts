import type { Reference, ReferenceKind, ReferenceUnit } from '#shared/schemas/reference'
import { oneDp } from '#shared/domain/number-text'

export const REFERENCE_KIND_LABEL: Record<ReferenceKind, string> = {
  'central-line': 'Central line CVP',
  'catheter-ra': 'Right heart catheter, right atrial pressure',
  'echo-ra': 'Echo right atrial pressure (IVC size and collapse)',
}

export const UNIT_LABEL: Record<ReferenceUnit, string> = { mmHg: 'mmHg', cmH2O: 'cmH₂O' }

/** "Central line CVP 12 mmHg (16.3 cmH₂O)": the value as entered, and in cmH₂O when entered in mmHg. */
export function referenceValueText(reference: Pick<Reference, 'kind' | 'value' | 'unit' | 'valueCmH2O'>): string {
  const entered = `${reference.value} ${UNIT_LABEL[reference.unit]}`
  return reference.unit === 'cmH2O' ? entered : `${entered} (${oneDp(reference.valueCmH2O)} cmH₂O)`
}

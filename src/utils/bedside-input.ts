import type { DraftFields, DraftRow } from '@/db/draft-schema'

function abdominojugularInput(test: DraftFields['abdominojugular']) {
  if (!test?.done) return { done: false }
  return { done: true, riseCm: test.riseCm ?? undefined, sustained: test.sustained, fallOnReleaseCm: test.fallOnReleaseCm ?? undefined }
}

/**
 * The draft as the shared input schema expects it: an undone abdominojugular test sends no numbers, a reason for a
 * column that was assessed after all is not sent, and the flow's own confirmations stay on the device.
 */
export function draftInput(row: Pick<DraftRow, 'id' | 'fields'>): Record<string, unknown> {
  const { abdominojugular, inclinationConfirmed: _angle, aboveNeckConfirmedDeg: _sitUp, notAssessableReason, notAssessableText, ...rest } = row.fields
  const notAssessable = rest.columnTop === 'not-assessable'
  return {
    ...rest,
    id: row.id,
    abdominojugular: abdominojugularInput(abdominojugular),
    notAssessableReason: notAssessable ? notAssessableReason : undefined,
    notAssessableText: notAssessable && notAssessableReason === 'other' ? notAssessableText : undefined,
  }
}

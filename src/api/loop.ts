import { AccuracySummarySchema, type AccuracyQuery } from '#shared/schemas/reference'
import { MyAgreementSchema } from '#shared/schemas/learning'
import { PatientTimelineSchema } from '#shared/schemas/timeline'
import { api } from './client'

const defined = (query: Record<string, string | undefined>) =>
  Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== '')) as Record<string, string>

/** Every exam of one patient code the reader may see, oldest first, with the references beside them. */
export function fetchPatientTimeline(patientCode: string) {
  return api.get(`patients/${encodeURIComponent(patientCode)}/timeline`).json().then((body) => PatientTimelineSchema.parse(body))
}

/** The estimate against measured pressures: bias, limits, band coverage and the newest pairs for the plots. */
export function fetchAccuracy(query: AccuracyQuery = {}) {
  return api.get('agreement/accuracy', { searchParams: defined(query) }).json().then((body) => AccuracySummarySchema.parse(body))
}

/** A resident's own agreement (or, for an attending, that of `residentId`): bias, mean |difference|, curve, feedback. */
export function fetchMyAgreement(residentId?: string) {
  return api.get('agreement/mine', { searchParams: defined({ residentId }) }).json().then((body) => MyAgreementSchema.parse(body))
}

import {
  AgreementPairListSchema,
  AgreementSummarySchema,
  AgreementTrendSchema,
  type AgreementPairsQuery,
  type AgreementQuery,
} from '#shared/schemas/agreement'
import { api } from './client'

const searchParamsOf = (query: Partial<AgreementPairsQuery>) =>
  Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== '')) as Record<string, string | number>

/** Bland–Altman, ICC(2,1), kappas and each examiner's bias over the pairs the filters select. */
export function fetchAgreementSummary(query: AgreementQuery = {}) {
  return api.get('agreement/summary', { searchParams: searchParamsOf(query) }).json().then((body) => AgreementSummarySchema.parse(body))
}

/** Bias, SD and limits per UTC month over the same pairs. */
export function fetchAgreementTrend(query: AgreementQuery = {}) {
  return api.get('agreement/trend', { searchParams: searchParamsOf(query) }).json().then((body) => AgreementTrendSchema.parse(body))
}

/** One page of the pairs, newest first. */
export function fetchAgreementPairs(query: Partial<AgreementPairsQuery> = {}) {
  return api.get('agreement/pairs', { searchParams: searchParamsOf(query) }).json().then((body) => AgreementPairListSchema.parse(body))
}

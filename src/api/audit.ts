import { AuditChainReportSchema, AuditPageSchema, type AuditQuery } from '#shared/schemas/audit'
import { api } from './client'

export function fetchAuditPage(query: Partial<AuditQuery> = {}) {
  const searchParams = Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== '')) as Record<
    string,
    string | number
  >
  return api
    .get('audit', { searchParams })
    .json()
    .then((body) => AuditPageSchema.parse(body))
}

/** Walks the trail's hash chain on the server and names the first broken link. */
export function verifyAuditChain() {
  // A long trail takes a while to walk; more than the default request timeout.
  return api
    .get('audit/verify', { timeout: 120_000 })
    .json()
    .then((body) => AuditChainReportSchema.parse(body))
}

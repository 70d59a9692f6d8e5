import { AuditPageSchema, type AuditQuery } from '#shared/schemas/audit'
import { api } from './client'

export function fetchAuditPage(query: Partial<AuditQuery> = {}) {
  const searchParams = Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined && v !== '')) as Record<string, string | number>
  return api.get('audit', { searchParams }).json().then((body) => AuditPageSchema.parse(body))
}

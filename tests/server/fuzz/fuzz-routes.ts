/**
 * Every route the API mounts (server/app.ts and the *.routes.ts files), with what it reads: `:id` in the path, a JSON
 * (or multipart) body, and the query parameters of its schema. A new route belongs here, or the fuzz suite misses it.
 */
export interface FuzzRoute {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete'
  path: string
  /** Whether the route reads a JSON body. */
  body?: boolean
  /** Query parameters its schema names. */
  query?: readonly string[]
  multipart?: boolean
}

const paging = ['page', 'pageSize'] as const
const examFilters = ['status', 'teamId', 'examinerId', 'patientCode', 'from', 'to'] as const
const agreementFilters = ['from', 'to', 'teamId', 'examinerId', 'inclinationBand', 'vein'] as const

export const FUZZ_ROUTES: readonly FuzzRoute[] = [
  { method: 'get', path: '/api/health' },
  { method: 'post', path: '/api/auth/login', body: true },
  { method: 'post', path: '/api/auth/refresh', body: true },
  { method: 'post', path: '/api/auth/logout', body: true },
  { method: 'post', path: '/api/auth/password-reset', body: true },
  { method: 'post', path: '/api/auth/set-password', body: true },
  { method: 'get', path: '/api/mailbox' },
  { method: 'get', path: '/api/agreement/summary', query: agreementFilters },
  { method: 'get', path: '/api/agreement/trend', query: agreementFilters },
  { method: 'get', path: '/api/agreement/pairs', query: [...agreementFilters, ...paging, 'export'] },
  { method: 'post', path: '/api/sync/push', body: true },
  { method: 'get', path: '/api/sync/pull', query: ['cursor', 'limit'] },
  { method: 'post', path: '/api/rounds', body: true },
  { method: 'get', path: '/api/rounds' },
  { method: 'get', path: '/api/rounds/:id' },
  { method: 'post', path: '/api/rounds/:id/close', body: true },
  { method: 'get', path: '/api/rounds/:id/results' },
  { method: 'get', path: '/api/settings' },
  { method: 'get', path: '/api/settings/versions/:id' },
  { method: 'put', path: '/api/admin/settings', body: true },
  { method: 'get', path: '/api/admin/settings/history' },
  { method: 'post', path: '/api/admin/roster/preview', multipart: true },
  { method: 'post', path: '/api/admin/roster/apply', multipart: true },
  { method: 'post', path: '/api/exams/:id/attachments', multipart: true },
  { method: 'get', path: '/api/exams/:id/attachments' },
  { method: 'get', path: '/api/attachments/:id' },
  { method: 'delete', path: '/api/attachments/:id' },
  { method: 'get', path: '/api/me' },
  { method: 'get', path: '/api/teams' },
  { method: 'get', path: '/api/admin/users' },
  { method: 'post', path: '/api/estimate', body: true },
  { method: 'get', path: '/api/exams', query: [...examFilters, ...paging, 'sort', 'order'] },
  { method: 'get', path: '/api/exams/:id' },
  { method: 'post', path: '/api/exams', body: true },
  { method: 'patch', path: '/api/exams/:id', body: true },
  { method: 'post', path: '/api/exams/:id/submit', body: true },
  { method: 'post', path: '/api/exams/:id/countersign', body: true },
  { method: 'post', path: '/api/exams/:id/return', body: true },
  { method: 'post', path: '/api/exams/:id/amend', body: true },
  { method: 'get', path: '/api/exams/:id/signatures' },
  { method: 'get', path: '/api/exams/:id/history' },
  { method: 'get', path: '/api/signoff-queue', query: [...paging, 'cursor', 'order', 'q', 'residentId'] },
  { method: 'get', path: '/api/signoff-queue/count' },
  { method: 'get', path: '/api/signoff-queue/residents' },
  { method: 'get', path: '/api/audit', query: ['actorId', 'action', 'entityType', 'entityId', 'from', 'to', ...paging] },
  { method: 'get', path: '/api/exams/:id/fhir' },
  { method: 'get', path: '/api/exports/exams.csv', query: examFilters },
  { method: 'get', path: '/api/admin/accounts', query: ['search', 'role', 'teamId', 'active', ...paging] },
  { method: 'get', path: '/api/admin/accounts/:id' },
  { method: 'post', path: '/api/admin/accounts', body: true },
  { method: 'patch', path: '/api/admin/accounts/:id', body: true },
  { method: 'post', path: '/api/admin/accounts/:id/deactivate', body: true },
  { method: 'post', path: '/api/admin/accounts/:id/reactivate', body: true },
  { method: 'post', path: '/api/admin/accounts/:id/invitation', body: true },
]

export const routeName = (route: FuzzRoute) => `${route.method.toUpperCase()} ${route.path}`

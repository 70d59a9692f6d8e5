import ky, { isHTTPError } from 'ky'
import { ApiErrorSchema } from '#shared/schemas/user'
import { accessToken, authorize } from './token'

export let api = ky.create({
  prefixUrl: '/api/',
  timeout: 10_000,
  credentials: 'same-origin',
  hooks: {
    beforeRequest: [(request) => authorize(request, accessToken.value)],
  },
})

/** Points the client at another server, e.g. a test server on a loopback port, optionally with another timeout. */
export function configureApiBase(prefixUrl: string, options: { timeout?: number } = {}) {
  api = api.extend({ prefixUrl, ...options })
}

export interface ReadableError {
  status: number | null
  code: string
  message: string
  fields: Record<string, string>
}

/** Turns any thrown value from `api` into a displayable error. */
export async function readApiError(e: unknown): Promise<ReadableError> {
  if (!isHTTPError(e)) {
    return { status: null, code: 'network', message: 'Cannot reach the server. Check your connection and try again.', fields: {} }
  }
  const status = e.response.status
  const body = ApiErrorSchema.safeParse(await e.response.json().catch(() => null))
  if (!body.success) return { status, code: `http-${status}`, message: `The server answered ${status}.`, fields: {} }
  const { code, message, fields = {} } = body.data.error
  return { status, code, message, fields }
}

// A proxy or gateway answering for a server it cannot reach: as good as no network.
const GATEWAY_STATUSES = new Set([502, 503, 504])

/** The server was not reached (no network, or a gateway answering for it), rather than refusing. */
export function serverUnreachable(e: unknown): boolean {
  return !isHTTPError(e) || GATEWAY_STATUSES.has(e.response.status)
}

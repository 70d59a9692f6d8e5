import type { Options } from 'ky'
import { ref } from 'vue'

/**
 * The access token, the only copy: the session store exposes this same ref. Kept in memory only so an XSS payload
 * cannot lift it from storage; the refresh cookie survives reloads instead.
 */
export const accessToken = ref<string | null>(null)

/** Sends the request with the given access token, if any. */
export function authorize(request: Request, token: string | null | undefined) {
  if (token) request.headers.set('Authorization', `Bearer ${token}`)
}

/**
 * Sends as the given account (the sync engine's): the hook runs after the client's own, so a session that changed
 * meanwhile can never lend its token; without a token, as the session. No ky retries: the sync engine backs off itself.
 */
export function asAccount(token: string | undefined): Options {
  return { retry: 0, hooks: { beforeRequest: [(request) => authorize(request, token)] } }
}

import { HTTPError, type NormalizedOptions } from 'ky'

/** The error ky throws for a non-2xx answer carrying the API's error body. */
export function httpError(status: number, code: string, message = code, fields?: Record<string, string>) {
  const body = { error: { code, message, ...(fields && { fields }) } }
  const response = new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } })
  return new HTTPError(response, new Request('http://localhost/api/test', { method: 'POST' }), {} as NormalizedOptions)
}

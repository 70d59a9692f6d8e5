import type { Options } from 'ky'
import { SyncPullResponseSchema, SyncPushResponseSchema, type SyncChangeInput } from '#shared/schemas/sync'
import { api } from './client'

/**
 * Sends as the account whose outbox this is: the hook runs after the client's own, so a session that changed
 * meanwhile can never lend its token. No ky retries: the sync engine backs off itself.
 */
function asAccount(token: string): Options {
  return { retry: 0, hooks: { beforeRequest: [(request) => request.headers.set('Authorization', `Bearer ${token}`)] } }
}

export function pushChanges(changes: SyncChangeInput[], token: string) {
  return api
    .post('sync/push', { json: { changes }, ...asAccount(token) })
    .json()
    .then((body) => SyncPushResponseSchema.parse(body).results)
}

export function pullChanges(cursor: number, token: string) {
  return api
    .get('sync/pull', { searchParams: { cursor }, ...asAccount(token) })
    .json()
    .then((body) => SyncPullResponseSchema.parse(body))
}

import { SyncPullResponseSchema, SyncPushResponseSchema, type SyncChangeInput } from '#shared/schemas/sync'
import { api } from './client'
import { asAccount } from './token'

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

import { SYNC_PUSH_LIMIT } from '#shared/schemas/sync'
import { readApiError, type ReadableError } from '@/api/client'
import { pullChanges, pushChanges } from '@/api/sync'
import { uploadPendingAttachments } from '@/db/attachments'
import { storePulled } from '@/db/local-exams'
import { loadCursor } from '@/db/meta'
import { nextBatch } from '@/db/outbox'
import { recordFailure, settleResults } from '@/db/outbox-settle'
import type { OutboxItem } from '@/db/sync-schema'
import { submitWaiting } from './exam-save'
import type { RenewOutcome } from './session'

// Under the server's 256 kB body limit, with room for the envelope.
const MAX_BATCH_BYTES = 200_000

/** The account a sync runs for: only its changes are read, and only its token is sent. */
export interface SyncAccount {
  id: string
  token: string
  /** False once the account signed out (and the device was wiped): nothing more is sent or stored for it. */
  isCurrent: () => boolean
}

export const UNANSWERED: ReadableError = { status: 502, code: 'unanswered', message: 'The server did not answer every change.', fields: {} }

const toChange = (item: OutboxItem) => ({ exam: item.payload, baseVersion: item.baseVersion })

async function pushBatch(account: SyncAccount, batch: OutboxItem[]): Promise<ReadableError | null> {
  try {
    const unanswered = await settleResults(batch, await pushChanges(batch.map(toChange), account.token))
    return unanswered ? UNANSWERED : null
  } catch (e) {
    const error = await readApiError(e)
    await recordFailure(batch, { code: error.code, message: error.message })
    return error
  }
}

/** Sends the account's outbox, batch after batch, until nothing is left to send or a request fails. */
export async function pushOutbox(account: SyncAccount): Promise<ReadableError | null> {
  let limit = SYNC_PUSH_LIMIT
  for (;;) {
    const batch = account.isCurrent() ? await nextBatch(account.id, limit, MAX_BATCH_BYTES) : []
    if (!batch.length) return null
    const error = await pushBatch(account, batch)
    // 413: the batch was too large for the server's body limit; halve it rather than give up.
    if (error?.status === 413 && limit > 1) limit = Math.ceil(batch.length / 2)
    else if (error) return error
  }
}

/** Brings every change the server has for the account since its cursor, page after page. */
export async function pullInto(account: SyncAccount): Promise<ReadableError | null> {
  try {
    let cursor = await loadCursor(account.id)
    for (let more = true; more; ) {
      const page = await pullChanges(cursor, account.token)
      if (!account.isCurrent()) return null
      await storePulled(account.id, page.exams, page.cursor, page.removed?.map((r) => r.id))
      ;({ cursor, more } = page)
    }
    return null
  } catch (e) {
    return readApiError(e)
  }
}

/**
 * Push, then pull: the pull then brings the server's copies of what was just accepted. Between the two, exams saved with
 * "Save and submit" while offline are submitted once their save has left the outbox, whatever page is open.
 */
export async function syncAccount(account: SyncAccount): Promise<ReadableError | null> {
  const pushed = await pushOutbox(account)
  if (pushed) return pushed
  if (account.isCurrent()) await submitWaiting(account.id)
  // Photos follow once their exam is on the server; a refused one stays on the device (issue 7).
  return (await pullInto(account)) ?? (await uploadPendingAttachments(account))
}

const SIGNED_OUT: ReadableError = { status: 401, code: 'not-signed-in', message: 'Sign in again to send your exams.', fields: {} }
const UNREACHABLE: ReadableError = { status: null, code: 'network', message: 'Cannot reach the server.', fields: {} }

/** What a sync needs of the session: its token, who is signed in, and a way to renew the token. */
export interface SyncSession {
  readonly token: string | null
  readonly user: { id: string } | null
  renew(userId: string): Promise<RenewOutcome>
}

/** One push-and-pull for the user; after a 401 it renews the token once from the refresh cookie, for that account only. */
export async function syncAs(userId: string, session: SyncSession): Promise<ReadableError | null> {
  const run = () => syncAccount({ id: userId, token: session.token!, isCurrent: () => session.user?.id === userId })
  const error = session.token ? await run() : SIGNED_OUT
  if (error?.status !== 401) return error
  const renewed = await session.renew(userId)
  if (renewed === 'unreachable') return UNREACHABLE
  return renewed === 'renewed' ? run() : error
}

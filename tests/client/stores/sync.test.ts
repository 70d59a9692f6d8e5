import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import type { User } from '#shared/schemas/user'
import { db } from '@/db'
import { useSessionStore } from '@/stores/session'
import { useSyncStore } from '@/stores/sync'
import { AuditEventModel, ExamModel } from '../../../server/models/index.ts'
import { makeAccount, saveOffline, startSyncServer } from './sync-server'

let server: Awaited<ReturnType<typeof startSyncServer>>

beforeAll(async () => {
  server = await startSyncServer()
})

afterAll(async () => {
  await server.close()
})

function signInAs(account: { user: User; token: string }) {
  Object.assign(useSessionStore(), { user: account.user, token: account.token })
}

const storedRows = (examId: string) => ExamModel.count({ where: { id: examId } })

describe('sync against the real server', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear()])
    Object.assign(server.faults, { failures: 0, stallMs: 0, onArrival: undefined })
    server.clientTimeout(10_000)
  })

  afterEach(() => {
    useSyncStore().stop()
  })

  it('sends a saved exam, and takes it out of the outbox only after the server acknowledged it', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    signInAs(account)
    let queuedWhileSending = -1
    server.faults.onArrival = async () => void (queuedWhileSending = await db.outbox.count())

    await useSyncStore().syncNow()

    expect(queuedWhileSending).toBe(1)
    expect(await db.outbox.count()).toBe(0)
    expect(await storedRows(exam.id)).toBe(1)
    expect(await db.exams.get(exam.id)).toMatchObject({ version: 1, examinerName: account.user.displayName })
    expect(useSyncStore()).toMatchObject({ unsynced: 0, attention: 0, lastError: null })
    expect(useSyncStore().lastSyncAt).not.toBeNull()
  })

  it('keeps the outbox through 500s, plans a retry, and sends it once the server recovers', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    signInAs(account)
    server.faults.failures = 2
    const sync = useSyncStore()

    await sync.syncNow()
    await sync.syncNow()

    expect(await db.outbox.toArray()).toMatchObject([{ examId: exam.id, state: 'pending', attempts: 2 }])
    expect(sync.unsynced).toBe(1)
    expect(sync.retryAt).not.toBeNull()
    expect(await storedRows(exam.id)).toBe(0)

    await sync.syncNow()

    expect(await db.outbox.count()).toBe(0)
    expect(await storedRows(exam.id)).toBe(1)
  })

  it('keeps the outbox when the answer is lost to a timeout; the retry is a duplicate, leaving one row and one audit event', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    signInAs(account)
    server.clientTimeout(300)
    server.faults.stallMs = 1_000
    const sync = useSyncStore()

    await sync.syncNow()

    expect(await db.outbox.count()).toBe(1)
    await vi.waitFor(async () => expect(await storedRows(exam.id)).toBe(1), { timeout: 3_000 })
    server.clientTimeout(10_000)

    await sync.syncNow()

    expect(await db.outbox.count()).toBe(0)
    expect(await storedRows(exam.id)).toBe(1)
    expect(await AuditEventModel.count({ where: { entityId: exam.id } })).toBe(1)
  })

  it('on a 401 it keeps the outbox, pauses and asks to sign in again; after signing in it sends', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    signInAs({ user: account.user, token: 'expired-token' })
    const sync = useSyncStore()

    await sync.syncNow()

    expect(sync.needsSignIn).toBe(true)
    expect(sync.retryAt).toBeNull()
    expect(await db.outbox.toArray()).toMatchObject([{ examId: exam.id, authorId: account.user.id, state: 'pending' }])
    expect(await storedRows(exam.id)).toBe(0)

    signInAs(account)
    await sync.syncNow()

    expect(sync.needsSignIn).toBe(false)
    expect(await db.outbox.count()).toBe(0)
    expect(await storedRows(exam.id)).toBe(1)
  })

  it('never sends one account’s outbox under another account that signs in on the same device', async () => {
    const first = await makeAccount()
    const second = await makeAccount()
    const firstExam = await saveOffline(first.user)
    const secondExam = await saveOffline(second.user)
    signInAs(second)

    await useSyncStore().syncNow()

    expect(await storedRows(secondExam.id)).toBe(1)
    expect(await storedRows(firstExam.id)).toBe(0)
    expect(await db.outbox.toArray()).toMatchObject([{ examId: firstExam.id, authorId: first.user.id, state: 'pending' }])
  })

  it('a refused change waits for attention with its field errors, without holding back the others', async () => {
    const account = await makeAccount()
    const good = await saveOffline(account.user)
    const future = new Date(Date.now() + 60 * 60 * 1000).toISOString()
    const refused = await saveOffline(account.user, { examinedAt: future })
    const after = await saveOffline(account.user)
    signInAs(account)
    const sync = useSyncStore()

    await sync.syncNow()

    expect([await storedRows(good.id), await storedRows(refused.id), await storedRows(after.id)]).toEqual([1, 0, 1])
    expect(await db.outbox.toArray()).toMatchObject([
      { examId: refused.id, state: 'needs-attention', lastError: { fields: { examinedAt: 'The time of the exam cannot be in the future' } } },
    ])
    expect(sync.attention).toBe(1)
  })

  it('a change made on a version the server has moved past is held as a conflict with the server’s copy', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    signInAs(account)
    const sync = useSyncStore()
    await sync.syncNow()
    await ExamModel.update({ heightCm: 2, version: 2 }, { where: { id: exam.id } })

    await saveOffline(account.user, { id: exam.id, heightCm: 6 })
    await sync.syncNow()

    expect(await db.outbox.toArray()).toMatchObject([{ state: 'conflict', baseVersion: 1, payload: { heightCm: 6 }, serverCopy: { heightCm: 2, version: 2 } }])
    expect((await ExamModel.findByPk(exam.id))!.heightCm).toBe(2)
  })
})

import './node-file-apis'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import type { User } from '#shared/schemas/user'
import { db } from '@/db'
import { addLocalPhotos, retryLocalPhoto } from '@/db/attachments'
import { wipeLocalData } from '@/db/wipe'
import { useSessionStore } from '@/stores/session'
import { useSyncStore } from '@/stores/sync'
import { attachments } from '../../../server/attachments/attachment.model.ts'
import { allowPhotos, makePhoto } from '../../server/attachments/photos.ts'
import { makeAccount, saveOffline } from '../stores/sync-server'
import { photoFile, startAttachmentServer } from './attachment-server'

let server: Awaited<ReturnType<typeof startAttachmentServer>>
let jpeg: Buffer

beforeAll(async () => {
  server = await startAttachmentServer()
  jpeg = await makePhoto('jpeg')
})

afterAll(async () => {
  await server.close()
})

function signInAs(account: { user: User; token: string }) {
  Object.assign(useSessionStore(), { user: account.user, token: account.token })
}

const onServer = (examId: string) => attachments().findAll({ where: { examId, deletedAt: null } })
const bytesOf = async (blob: Blob) => Buffer.from(await blob.arrayBuffer())

async function photoWaiting(account: { user: User }, examId: string, file = photoFile(jpeg)) {
  const { added, problems } = await addLocalPhotos(examId, account.user.id, [file], { consent: true })
  expect(problems).toEqual([])
  return added[0]!
}

describe('photos waiting on the device, sent by the sync engine', () => {
  beforeEach(async () => {
    setActivePinia(createPinia())
    await Promise.all([db.drafts.clear(), db.exams.clear(), db.outbox.clear(), db.meta.clear(), db.attachments.clear()])
    Object.assign(server.uploads, { failures: 0, arrived: 0 })
    server.push.failures = 0
    await allowPhotos(true)
  })

  afterEach(() => {
    useSyncStore().stop()
  })

  it('sends a photo only after its exam reached the server, and removes it from the device only once acknowledged', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    const photo = await photoWaiting(account, exam.id)
    signInAs(account)
    server.push.failures = 1

    await useSyncStore().syncNow()

    // The exam did not get through, so the photo was not even tried.
    expect(server.uploads.arrived).toBe(0)
    expect(await db.attachments.get(photo.id)).toMatchObject({ state: 'pending' })

    await useSyncStore().syncNow()

    const stored = await onServer(exam.id)
    expect(stored.map((row) => ({ id: row.id, mimeType: row.mimeType, createdBy: row.createdBy }))).toEqual([
      { id: photo.id, mimeType: 'image/jpeg', createdBy: account.user.id },
    ])
    expect(await db.attachments.count()).toBe(0)
    expect(await db.outbox.count()).toBe(0)
  })

  it('keeps a photo whose upload failed (503) with its bytes, and sends it on the next sync', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    const photo = await photoWaiting(account, exam.id)
    signInAs(account)
    server.uploads.failures = 1
    const sync = useSyncStore()

    await sync.syncNow()

    const kept = (await db.attachments.get(photo.id))!
    expect(kept).toMatchObject({ state: 'pending', attempts: 1 })
    expect(await bytesOf(kept.blob)).toEqual(jpeg)
    expect(await onServer(exam.id)).toHaveLength(0)
    // The failure counts as a failed sync: a retry is planned.
    expect(sync.retryAt).not.toBeNull()

    await sync.syncNow()

    expect(await onServer(exam.id)).toHaveLength(1)
    expect(await db.attachments.count()).toBe(0)
  })

  it('marks a refused photo (photos switched off) as failed with the reason, keeps it, and sends it when tried again', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    const photo = await photoWaiting(account, exam.id)
    signInAs(account)
    await allowPhotos(false)

    await useSyncStore().syncNow()

    const refused = (await db.attachments.get(photo.id))!
    expect(refused.state).toBe('failed')
    expect(refused.lastError).toMatch(/switched off/)
    expect(await bytesOf(refused.blob)).toEqual(jpeg)
    // A refused photo does not block the sync of exams.
    expect(useSyncStore().lastError).toBeNull()

    await allowPhotos(true)
    await retryLocalPhoto(photo.id)
    await useSyncStore().syncNow()

    expect(await onServer(exam.id)).toHaveLength(1)
    expect(await db.attachments.count()).toBe(0)
  })

  it('marks a file that is not really a photo as failed after the server refused it (415), keeping it for the user', async () => {
    const account = await makeAccount()
    const exam = await saveOffline(account.user)
    const fake = photoFile(Buffer.from('<html><body>not a photo</body></html>'), 'neck.jpg', 'image/jpeg')
    const photo = await photoWaiting(account, exam.id, fake)
    signInAs(account)

    await useSyncStore().syncNow()

    expect(await db.attachments.get(photo.id)).toMatchObject({ state: 'failed', lastError: 'Only JPEG, PNG or WebP photos can be attached' })
    expect(await onServer(exam.id)).toHaveLength(0)
  })

  it('holds back the photo of a bedside draft not saved yet: nothing is sent', async () => {
    const account = await makeAccount()
    const photo = await photoWaiting(account, crypto.randomUUID())
    signInAs(account)

    await useSyncStore().syncNow()

    expect(server.uploads.arrived).toBe(0)
    expect(await db.attachments.get(photo.id)).toMatchObject({ state: 'pending', attempts: 0 })
  })

  it('never sends one account’s photo under another account', async () => {
    const author = await makeAccount()
    const exam = await saveOffline(author.user)
    await photoWaiting(author, exam.id)
    const other = await makeAccount()
    signInAs(other)

    await useSyncStore().syncNow()

    expect(server.uploads.arrived).toBe(0)
    expect(await db.attachments.count()).toBe(1)
  })

  it('signing out wipes the photos kept on the device with everything else', async () => {
    const account = await makeAccount()
    await photoWaiting(account, crypto.randomUUID())

    await wipeLocalData()

    expect(await db.attachments.count()).toBe(0)
  })
})

import Dexie from 'dexie'
import { beforeEach, describe, expect, it } from 'vitest'
import { db } from '@/db'
import { keepMine, listConflicts, takeServer } from '@/db/conflicts'
import { loadDraft } from '@/db/drafts'
import { storePulled } from '@/db/local-exams'
import { loadCursor, loadProfile, saveProfile } from '@/db/meta'
import { nextBatch } from '@/db/outbox'
import { settleResults } from '@/db/outbox-settle'
import { BACKGROUND_SYNC_DB, wipeLocalData } from '@/db/wipe'
import { makeExam } from '../components/exam/make-exam'
import { makeDraft } from '../factories/draft'
import { AUTHOR, clearDevice, queued, save } from './outbox-factory'

async function inConflictWith(theirs: Parameters<typeof makeExam>[0]) {
  const input = await save()
  const serverCopy = makeExam({ id: input.id, examinerId: 'u-1', heightCm: 2, version: 2, ...theirs })
  await settleResults(await nextBatch('u-1', 200, 200_000), [{ id: input.id, result: 'conflict', exam: serverCopy }])
  const [conflict] = await listConflicts('u-1')
  return { input, conflict: conflict! }
}

describe('exams, conflicts and sync state on this device', () => {
  beforeEach(clearDevice)

  it('stores a pulled page with its cursor, keeping the local copy of an exam with unsent changes', async () => {
    const pending = await save()
    const pulled = makeExam({ status: 'countersigned' })

    await storePulled('u-1', [pulled, makeExam({ id: pending.id, heightCm: 9 })], 42)

    expect(await db.exams.get(pulled.id)).toMatchObject({ status: 'countersigned', ownerId: 'u-1' })
    expect((await db.exams.get(pending.id))!.heightCm).toBe(4)
    expect(await loadCursor('u-1')).toBe(42)
    expect(await loadCursor('u-2')).toBe(0)
  })

  it('a pulled removal drops only the owner’s read copy: not another account’s, not one with unsent changes, never a draft', async () => {
    const pending = await save()
    const mine = makeExam({ status: 'submitted' })
    const theirs = makeExam({ status: 'submitted' })
    await db.exams.bulkPut([
      { ...mine, ownerId: 'u-1' },
      { ...theirs, ownerId: 'u-2' },
    ])
    const draftsBefore = await db.drafts.count()

    await storePulled('u-1', [], 51, [mine.id, theirs.id, pending.id, 'never-held'])

    expect(await db.exams.get(mine.id)).toBeUndefined()
    expect(await db.exams.get(theirs.id)).toMatchObject({ ownerId: 'u-2' })
    expect(await db.exams.get(pending.id)).toMatchObject({ ownerId: 'u-1' })
    expect(await queued()).toMatchObject([{ examId: pending.id, state: 'pending' }])
    expect(await db.drafts.count()).toBe(draftsBefore)
    expect(await loadCursor('u-1')).toBe(51)
  })

  it('a pulled newer server copy replaces the one a conflict compares with', async () => {
    const { input } = await inConflictWith({})

    await storePulled('u-1', [makeExam({ id: input.id, examinerId: 'u-1', heightCm: 3, version: 3 })], 7)

    expect((await listConflicts('u-1'))[0]!.theirs).toMatchObject({ heightCm: 3, version: 3 })
  })

  it('keeping mine queues the local version again, based on the server’s version', async () => {
    const { conflict } = await inConflictWith({})

    const kept = await keepMine(conflict.seq)

    expect(kept).toBe(true)
    expect(await queued()).toMatchObject([{ state: 'pending', baseVersion: 2, payload: { heightCm: 4 }, serverCopy: null }])
  })

  it('refuses to keep mine over a countersigned record, and changes nothing', async () => {
    const { conflict } = await inConflictWith({ status: 'countersigned' })

    const kept = await keepMine(conflict.seq)

    expect(kept).toBe(false)
    expect(await queued()).toMatchObject([{ state: 'conflict' }])
  })

  it('taking the server’s version drops mine from the outbox, the exam copy and the draft', async () => {
    const { input, conflict } = await inConflictWith({})

    await takeServer(conflict.seq)

    expect(await queued()).toEqual([])
    expect(await db.exams.get(input.id)).toMatchObject({ heightCm: 2, version: 2, ownerId: 'u-1' })
    expect(await loadDraft(input.id)).toMatchObject({ state: 'saved', fields: { heightCm: 2 } })
  })

  it('wiping leaves no draft, exam, outbox change or profile on the device', async () => {
    await save()
    await saveProfile(AUTHOR)

    await wipeLocalData()

    expect([await db.drafts.count(), await db.exams.count(), await db.outbox.count(), await db.meta.count()]).toEqual([0, 0, 0, 0])
    expect(await loadProfile()).toBeNull()
  })

  it('wiping also deletes the pushes that service workers of earlier versions held for Background Sync', async () => {
    const queue = new Dexie(BACKGROUND_SYNC_DB)
    queue.version(1).stores({ requests: '++id, queueName' })
    await queue.table('requests').add({ queueName: 'plumbline-push', requestData: { url: '/api/sync/push' } })
    queue.close()

    await wipeLocalData()

    const names = (await indexedDB.databases()).map((d) => d.name)
    expect(names).not.toContain(BACKGROUND_SYNC_DB)
    expect(names).toContain('plumbline')
  })

  it('upgrading a device from database version 1 keeps the drafts it held', async () => {
    db.close()
    await Dexie.delete('plumbline')
    const v1 = new Dexie('plumbline')
    v1.version(1).stores({ drafts: 'id, state, updatedAt' })
    await v1.table('drafts').put(makeDraft({ patientCode: 'SM-0007' }, { id: 'from-v1' }))
    v1.close()

    await db.open()

    expect((await loadDraft('from-v1'))?.fields.patientCode).toBe('SM-0007')
    expect(await db.outbox.count()).toBe(0)
    expect(db.verno).toBe(3)
  })
})

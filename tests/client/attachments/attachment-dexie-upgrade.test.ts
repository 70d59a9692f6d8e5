import './node-file-apis'
import Dexie from 'dexie'
import { describe, expect, it } from 'vitest'
import { db } from '@/db'
import { addLocalPhotos } from '@/db/attachments'
import { loadDraft } from '@/db/drafts'
import { makeExam } from '../components/exam/make-exam'
import { makeDraft } from '../factories/draft'
import { photoFile } from './attachment-server'

describe('database version 3: photos waiting on the device', () => {
  it('upgrading a device from version 2 keeps its drafts, exam copies, outbox and sync state, and adds an empty photo table', async () => {
    db.close()
    await Dexie.delete('plumbline')
    // Version 2 exactly as shipped (src/db/index.ts before the photos).
    const v2 = new Dexie('plumbline')
    v2.version(1).stores({ drafts: 'id, state, updatedAt' })
    v2.version(2).stores({ exams: 'id, ownerId', outbox: '++seq, examId, authorId', meta: 'key' })
    const exam = { ...makeExam({ patientCode: 'SM-0142' }), ownerId: 'u-1' }
    await v2.table('drafts').put(makeDraft({ patientCode: 'SM-0007' }, { id: 'draft-from-v2' }))
    await v2.table('exams').put(exam)
    await v2.table('outbox').add({ examId: exam.id, authorId: 'u-1', payload: { id: exam.id }, baseVersion: 1, state: 'pending', attempts: 0, lastError: null, serverCopy: null, queuedAt: '2026-12-01T08:00:00.000Z' })
    await v2.table('meta').put({ key: 'cursor:u-1', value: 17 })
    v2.close()

    await db.open()

    expect(db.verno).toBe(3)
    expect((await loadDraft('draft-from-v2'))?.fields.patientCode).toBe('SM-0007')
    expect((await db.exams.get(exam.id))?.patientCode).toBe('SM-0142')
    expect(await db.outbox.toArray()).toMatchObject([{ seq: 1, examId: exam.id, authorId: 'u-1', state: 'pending' }])
    expect(await db.meta.get('cursor:u-1')).toEqual({ key: 'cursor:u-1', value: 17 })
    expect(await db.attachments.count()).toBe(0)
  })

  it('keeps a chosen photo as a Blob with its bytes, type and consent, waiting to be sent', async () => {
    const bytes = Buffer.from([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 4])

    const { added } = await addLocalPhotos('exam-1', 'u-1', [photoFile(bytes, 'neck.jpg')], { consent: true })

    const row = (await db.attachments.get(added[0]!.id))!
    expect(row).toMatchObject({ examId: 'exam-1', authorId: 'u-1', mime: 'image/jpeg', name: 'neck.jpg', size: 8, consent: true, state: 'pending' })
    expect(row.blob).toBeInstanceOf(Blob)
    expect(Buffer.from(await row.blob.arrayBuffer())).toEqual(bytes)
  })

  it('refuses, before storing anything, photos without consent, of another type, over 5 MB, or beyond 4 per exam', async () => {
    await db.attachments.clear()
    const jpeg = (name: string, size = 10) => photoFile(Buffer.alloc(size, 1), name)

    const noConsent = await addLocalPhotos('exam-2', 'u-1', [jpeg('a.jpg')], { consent: false })
    const wrong = await addLocalPhotos('exam-2', 'u-1', [photoFile(Buffer.from('GIF89a'), 'anim.gif', 'image/gif'), jpeg('big.jpg', 5 * 1024 * 1024 + 1)], { consent: true })
    // One photo already on the server: three more fit.
    const many = await addLocalPhotos('exam-2', 'u-1', ['1', '2', '3', '4'].map((n) => jpeg(`${n}.jpg`)), { consent: true, storedCount: 1 })

    expect(noConsent).toEqual({ added: [], problems: ['Tick that the patient consented before adding photos.'] })
    expect(wrong.added).toEqual([])
    expect(wrong.problems).toEqual(['“anim.gif” is not a JPEG, PNG or WebP photo.', '“big.jpg” is over 5 MB; take the photo again at a lower resolution.'])
    expect(many.added.map((row) => row.name)).toEqual(['1.jpg', '2.jpg', '3.jpg'])
    expect(many.problems).toEqual(['“4.jpg” was not added: an exam holds at most 4 photos.'])
    expect(await db.attachments.where('examId').equals('exam-2').count()).toBe(3)
  })
})

import { beforeEach, describe, expect, it } from 'vitest'
import { db } from '@/db'
import { loadDraft } from '@/db/drafts'
import { nextBatch, outboxCounts } from '@/db/outbox'
import { recordFailure, settleResults } from '@/db/outbox-settle'
import { makeExam } from '../components/exam/make-exam'
import { makeUser } from '../factories/user'
import { AUTHOR, clearDevice, examInput, queued, save } from './outbox-factory'

describe('the outbox', () => {
  beforeEach(clearDevice)

  it('saving an exam writes its local copy, one pending change and the draft marked saved, together', async () => {
    const input = await save()

    expect(await queued()).toMatchObject([{ examId: input.id, authorId: 'u-1', baseVersion: null, state: 'pending', attempts: 0 }])
    expect(await db.exams.get(input.id)).toMatchObject({ id: input.id, ownerId: 'u-1', version: 0, status: 'draft' })
    // h = 4 cm at 45°, Seth offset 9.7 cm → 13.7 cmH₂O (Seth 2002, J Gen Intern Med 17:861–865), computed on the device.
    expect((await db.exams.get(input.id))!.estimate.cvpCmH2O).toBeCloseTo(13.7, 5)
    expect((await loadDraft(input.id))?.state).toBe('saved')
  })

  it('a change to an exam the server holds is based on the version this device last had from it', async () => {
    const exam = makeExam({ examinerId: 'u-1', version: 3 })
    await db.exams.put({ ...exam, ownerId: 'u-1' })

    await save(examInput({ id: exam.id, heightCm: 6 }))

    expect(await queued()).toMatchObject([{ examId: exam.id, baseVersion: 3 }])
    expect(await db.exams.get(exam.id)).toMatchObject({ heightCm: 6, version: 3 })
  })

  it('a second save of an exam not yet acknowledged waits behind the first, on the same base', async () => {
    const input = await save()

    await save({ ...input, heightCm: 6 })

    expect(await queued()).toMatchObject([{ baseVersion: null }, { baseVersion: null, payload: { heightCm: 6 } }])
  })

  it('the next batch holds only the author’s changes, the first of each exam, and none of an exam held for the user', async () => {
    const first = await save()
    await save({ ...first, heightCm: 6 })
    const held = await save()
    await db.outbox.where('examId').equals(held.id).modify({ state: 'conflict' })
    await save(examInput(), makeUser({ id: 'u-2' }))
    const last = await save()

    const batch = await nextBatch('u-1', 200, 200_000)

    expect(batch.map((item) => [item.examId, item.payload.heightCm])).toEqual([
      [first.id, 4],
      [last.id, 4],
    ])
  })

  it('the next batch stops at the count and at the size given', async () => {
    for (let i = 0; i < 5; i++) await save()
    const size = JSON.stringify((await queued())[0]!.payload).length

    const byCount = await nextBatch('u-1', 3, 200_000)
    const bySize = await nextBatch('u-1', 200, size * 2 + 1)

    expect(byCount).toHaveLength(3)
    expect(bySize).toHaveLength(2)
  })

  it('an acknowledged change leaves; the exam’s later changes move onto the version the server gave', async () => {
    const input = await save()
    const batch = await nextBatch('u-1', 200, 200_000)
    await save({ ...input, heightCm: 6 })

    await settleResults(batch, [{ id: input.id, result: 'applied', version: 1 }])

    expect(await queued()).toMatchObject([{ baseVersion: 1, payload: { heightCm: 6 } }])
    expect((await db.exams.get(input.id))!.version).toBe(1)
  })

  it('a conflict keeps one change for the user, holding the newest local version and the server’s copy', async () => {
    const input = await save()
    const batch = await nextBatch('u-1', 200, 200_000)
    await save({ ...input, heightCm: 6 })
    const theirs = makeExam({ id: input.id, heightCm: 2, version: 2 })

    await settleResults(batch, [{ id: input.id, result: 'conflict', exam: theirs }])

    expect(await queued()).toMatchObject([{ state: 'conflict', payload: { heightCm: 6 }, serverCopy: { heightCm: 2, version: 2 } }])
    expect(await outboxCounts('u-1')).toEqual({ unsynced: 1, attention: 1 })
  })

  it('a refused change waits for the user with the server’s field errors', async () => {
    const input = await save()
    const error = { code: 'invalid-input', message: 'Some fields need attention', fields: { teamId: 'Choose one of your own teams' } }

    await settleResults(await nextBatch('u-1', 200, 200_000), [{ id: input.id, result: 'rejected', error }])

    expect(await queued()).toMatchObject([{ state: 'needs-attention', lastError: error, attempts: 1 }])
  })

  it('a refused change that a later save already replaced is dropped, and the later one goes on', async () => {
    const input = await save()
    const batch = await nextBatch('u-1', 200, 200_000)
    await save({ ...input, teamId: 't-1', notes: 'fixed' })

    await settleResults(batch, [{ id: input.id, result: 'rejected', error: { code: 'invalid-input', message: 'Some fields need attention' } }])

    expect(await queued()).toMatchObject([{ state: 'pending', payload: { notes: 'fixed' } }])
  })

  it('a change the server did not answer, or a failed request, keeps every change queued and counts the attempt', async () => {
    const [a, b] = [await save(), await save()]
    const batch = await nextBatch('u-1', 200, 200_000)

    const unanswered = await settleResults(batch, [{ id: a.id, result: 'applied', version: 1 }])
    await recordFailure(await nextBatch('u-1', 200, 200_000), { code: 'internal', message: 'Something went wrong on the server' })

    expect(unanswered).toBe(1)
    expect(await queued()).toMatchObject([{ examId: b.id, state: 'pending', attempts: 2, lastError: { code: 'internal' } }])
  })

  it('a new save of an exam held in conflict updates the local version the conflict shows', async () => {
    const input = await save()
    await settleResults(await nextBatch('u-1', 200, 200_000), [{ id: input.id, result: 'conflict', exam: makeExam({ id: input.id, version: 2 }) }])

    await save({ ...input, notes: 'newest' })

    expect(await queued()).toMatchObject([{ state: 'conflict', payload: { notes: 'newest' } }])
  })

  it('counts exams, not changes, and only the author’s', async () => {
    const input = await save()
    await save({ ...input, heightCm: 6 })
    await save(examInput(), AUTHOR)
    await save(examInput(), makeUser({ id: 'u-2' }))

    expect(await outboxCounts('u-1')).toEqual({ unsynced: 2, attention: 0 })
  })
})

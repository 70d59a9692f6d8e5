import { computeEstimate } from '#shared/domain/estimate'
import type { Exam, ExamInput, ObserverTerm } from '#shared/schemas/exam'
import type { EstimateSettings } from '#shared/schemas/settings'
import type { User } from '#shared/schemas/user'
import { db } from './index'
import { cursorKey } from './meta'
import { queuedFor } from './outbox-queries'
import { LocalExamSchema, type LocalExam } from './sync-schema'

/** A plain copy: IndexedDB cannot clone Vue proxies. */
export function plain<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T
}

/** What an estimate on this device is computed with: the settings in use, their error term and their version. */
export type EstimateBasis = { settings: EstimateSettings; observer: ObserverTerm; settingsVersion: number | undefined }

/**
 * The exam as this device shows it until the server's copy arrives: the saved record, estimated offline with the
 * settings and error term in use (those the band was reviewed with).
 */
export function localExamOf(input: ExamInput, author: User, basis: EstimateBasis, previous?: LocalExam): LocalExam {
  const now = new Date().toISOString()
  const { reviewed: _reviewed, ...record } = input
  const estimate = computeEstimate(input, { settings: basis.settings, observer: basis.observer })
  return {
    ...record,
    examinerId: author.id,
    examinerName: author.displayName,
    teamName: author.teams.find((t) => t.id === input.teamId)?.name ?? previous?.teamName ?? '',
    status: previous?.status ?? 'draft',
    version: previous?.version ?? 0,
    estimate: { ...estimate, settingsVersion: basis.settingsVersion },
    createdAt: previous?.createdAt ?? now,
    updatedAt: now,
    submittedAt: previous?.submittedAt ?? null,
    signatures: previous?.signatures ?? [],
    returnComment: previous?.returnComment ?? null,
    ownerId: author.id,
  }
}

/** The user's copy of one exam on this device, if readable. */
export async function loadLocalExam(id: string, ownerId: string): Promise<LocalExam | undefined> {
  const parsed = LocalExamSchema.safeParse(await db.exams.get(id))
  return parsed.success && parsed.data.ownerId === ownerId ? parsed.data : undefined
}

/** Drops the owner's read copies of exams they may no longer read, except those with changes still in the outbox. */
async function dropRemoved(ownerId: string, removedIds: string[]) {
  if (!removedIds.length) return
  const queued = await queuedFor(removedIds)
  const copies = await db.exams.bulkGet(removedIds)
  const gone = copies.filter((copy) => copy?.ownerId === ownerId && !queued.get(copy.id)?.length).map((copy) => copy!.id)
  await db.exams.bulkDelete(gone)
}

/**
 * Stores a pulled page and its cursor together. An exam with changes still in the outbox keeps its local copy;
 * a conflict waiting for the user gets the newer server copy to compare with. Exams the user may no longer read
 * (`removedIds`) lose their read copy; the user's unsent changes and drafts are never touched.
 */
export async function storePulled(ownerId: string, exams: Exam[], cursor: number, removedIds: string[] = []): Promise<void> {
  await db.transaction('rw', db.exams, db.outbox, db.meta, async () => {
    const queued = await queuedFor(exams.map((e) => e.id))
    const copies: LocalExam[] = []
    for (const exam of exams) {
      const items = queued.get(exam.id) ?? []
      const conflict = items.find((item) => item.state === 'conflict')
      if (conflict) await db.outbox.update(conflict.seq, { serverCopy: plain(exam) })
      if (!items.length) copies.push(plain({ ...exam, ownerId }))
    }
    await db.exams.bulkPut(copies)
    await dropRemoved(ownerId, removedIds)
    await db.meta.put({ key: cursorKey(ownerId), value: cursor })
  })
}

import { liveQuery } from 'dexie'
import { ATTACHMENT_MAX_BYTES, ATTACHMENT_MIME_TYPES, ATTACHMENTS_PER_EXAM, type AttachmentMime } from '#shared/schemas/attachment'
import { readApiError, type ReadableError } from '@/api/client'
import { uploadAttachment } from '@/api/attachments'
import { db } from './index'

/**
 * A photo waiting on this device to be sent with its exam. `pending` waits for the exam to reach the server (and for
 * a network); `failed` was refused by the server (its reason in `lastError`) and waits for the user; `uploaded` is
 * never kept: an acknowledged upload removes the row and its blob.
 */
export type LocalAttachmentState = 'pending' | 'uploaded' | 'failed'

export interface LocalAttachment {
  /** Made on this device and sent along, so a retried upload stores one photo on the server, not two. */
  id: string
  /** The exam's id, which is also the id of the bedside draft it was taken in. */
  examId: string
  authorId: string
  blob: Blob
  mime: AttachmentMime
  /** The file's name on the device, for display only. */
  name: string
  size: number
  /** The author ticked that consent was obtained before choosing the photo. */
  consent: true
  state: LocalAttachmentState
  attempts: number
  lastError: string | null
  createdAt: string
}

const MB = ATTACHMENT_MAX_BYTES / (1024 * 1024)
const isPhotoType = (type: string): type is AttachmentMime => (ATTACHMENT_MIME_TYPES as readonly string[]).includes(type)

/** Why a chosen file cannot be attached, checked on the device before anything is stored (the server checks again). */
export function photoProblem(file: Pick<File, 'name' | 'type' | 'size'>): string | null {
  if (!isPhotoType(file.type)) return `“${file.name}” is not a JPEG, PNG or WebP photo.`
  if (file.size > ATTACHMENT_MAX_BYTES) return `“${file.name}” is over ${MB} MB; take the photo again at a lower resolution.`
  if (file.size === 0) return `“${file.name}” is empty.`
  return null
}

export function localAttachmentsOf(examId: string): Promise<LocalAttachment[]> {
  return db.attachments.where('examId').equals(examId).sortBy('createdAt')
}

/** Calls `next` with the exam's photos waiting on this device now and after every change; answers how to stop. */
export function watchLocalAttachments(examId: string, next: (rows: LocalAttachment[]) => void): () => void {
  const subscription = liveQuery(() => localAttachmentsOf(examId)).subscribe({ next, error: () => undefined })
  return () => subscription.unsubscribe()
}

export interface AddedPhotos {
  added: LocalAttachment[]
  problems: string[]
}

/**
 * Keeps the chosen photos on this device until they are sent, after the author confirmed consent. Refuses files of
 * another type or over 5 MB, and any beyond 4 per exam counting those already on the server (`storedCount`).
 */
export async function addLocalPhotos(
  examId: string,
  authorId: string,
  files: readonly File[],
  options: { consent: boolean; storedCount?: number },
): Promise<AddedPhotos> {
  if (!options.consent) return { added: [], problems: ['Tick that the patient consented before adding photos.'] }
  return db.transaction('rw', db.attachments, async () => {
    const problems: string[] = []
    const added: LocalAttachment[] = []
    let room = ATTACHMENTS_PER_EXAM - (options.storedCount ?? 0) - (await db.attachments.where('examId').equals(examId).count())
    for (const file of files) {
      const problem = photoProblem(file)
      if (problem) problems.push(problem)
      else if (room <= 0) problems.push(`“${file.name}” was not added: an exam holds at most ${ATTACHMENTS_PER_EXAM} photos.`)
      else {
        room -= 1
        const row: LocalAttachment = {
          id: crypto.randomUUID(),
          examId,
          authorId,
          // A plain Blob (slice copies nothing): what IndexedDB keeps most reliably across browsers.
          blob: file.slice(0, file.size, file.type),
          mime: file.type as AttachmentMime,
          name: file.name,
          size: file.size,
          consent: true,
          state: 'pending',
          attempts: 0,
          lastError: null,
          createdAt: new Date().toISOString(),
        }
        await db.attachments.add(row)
        added.push(row)
      }
    }
    return { added, problems }
  })
}

export async function removeLocalPhoto(id: string): Promise<void> {
  await db.attachments.delete(id)
}

/** A refused photo is offered again: it goes back to the queue. */
export async function retryLocalPhoto(id: string): Promise<void> {
  await db.attachments.update(id, { state: 'pending', lastError: null })
}

/** The account uploads run for (the sync engine's): its token, and whether it is still the one signed in. */
export interface UploadAccount {
  id: string
  token: string
  isCurrent: () => boolean
}

/**
 * Whether the exam is on the server: saved on this device (or pulled), with no change of it still waiting to be sent
 * or never acknowledged. A photo of a bedside draft not yet saved waits, rather than sending 5 MB to hear 404.
 */
async function examOnServer(examId: string, authorId: string): Promise<boolean> {
  if (!(await db.exams.get(examId))) return false
  const items = await db.outbox.where('examId').equals(examId).toArray()
  return !items.some((item) => item.authorId === authorId && (item.state === 'pending' || item.baseVersion === null))
}

/** A refusal no retry can change: the photo waits for the user (remove it, or try it again). */
const isRefusal = (error: ReadableError) => error.status !== null && error.status >= 400 && error.status < 500 && ![401, 404, 408, 429].includes(error.status)

/**
 * Sends the account's waiting photos whose exam is on the server, one by one. Only the server's acknowledgement removes
 * a photo from this device; a refusal marks it `failed` with the reason and keeps it. Answers the first error that a
 * later sync may overcome (no network, a 5xx, a 401), after which it stops.
 */
export async function uploadPendingAttachments(account: UploadAccount): Promise<ReadableError | null> {
  if (!account.isCurrent()) return null
  const waiting = (await db.attachments.where('authorId').equals(account.id).sortBy('createdAt')).filter((row) => row.state === 'pending')
  for (const row of waiting) {
    if (!account.isCurrent()) return null
    if (!(await examOnServer(row.examId, account.id))) continue
    try {
      await uploadAttachment(row.examId, { id: row.id, blob: row.blob, name: row.name }, account.token)
      await db.attachments.delete(row.id)
    } catch (e) {
      const error = await readApiError(e)
      // 404: the exam is not on the server (yet); the photo waits for it like any other pending one.
      if (isRefusal(error)) await db.attachments.update(row.id, { state: 'failed', attempts: row.attempts + 1, lastError: error.message })
      else await db.attachments.update(row.id, { attempts: row.attempts + 1, lastError: error.message })
      if (!isRefusal(error) && error.status !== 404) return error
    }
  }
  return null
}

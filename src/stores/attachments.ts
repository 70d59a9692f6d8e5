import { defineStore } from 'pinia'
import { computed, reactive, ref } from 'vue'
import { ATTACHMENTS_PER_EXAM, type Attachment } from '#shared/schemas/attachment'
import { readApiError } from '@/api/client'
import { deleteAttachment, fetchAttachmentBlob, fetchAttachments, fetchPhotosAllowed } from '@/api/attachments'
import { addLocalPhotos, removeLocalPhoto, retryLocalPhoto, watchLocalAttachments, type LocalAttachment } from '@/db/attachments'
import { loadDraft } from '@/db/drafts'
import { loadLocalExam } from '@/db/local-exams'
import { queuedFor } from '@/db/outbox-queries'
import { storageProblem } from '@/db/storage-errors'
import { useSessionStore } from './session'
import { useSyncStore } from './sync'

function objectUrl(blob: Blob): string {
  return typeof URL.createObjectURL === 'function' ? URL.createObjectURL(blob) : ''
}

/**
 * Whether the server cannot have this exam yet: a bedside draft never saved, or a first save still waiting in the
 * outbox. Asking for its photos would only answer 404.
 */
async function notOnServerYet(examId: string, userId: string): Promise<boolean> {
  const queued = (await queuedFor([examId])).get(examId) ?? []
  if (queued.some((item) => item.authorId === userId && item.baseVersion === null)) return true
  return !(await loadLocalExam(examId, userId)) && !!(await loadDraft(examId))
}

/**
 * The photos of the exam open in the photo picker: those on the server (fetched with the bearer token, shown through
 * object URLs revoked on close) and those waiting on this device, which are sent once the exam is on the server.
 */
export const useAttachmentsStore = defineStore('attachments', () => {
  const session = useSessionStore()
  const sync = useSyncStore()
  const examId = ref<string | null>(null)
  const local = ref<LocalAttachment[]>([])
  const stored = ref<Attachment[]>([])
  /** Why the server's photos are not shown (offline, or hidden for the role); empty when they are. */
  const storedNote = ref('')
  /** The hospital's setting; null while unknown (offline): photos may still be queued, the server decides. */
  const allowed = ref<boolean | null>(null)
  const problems = ref<string[]>([])
  const busy = ref(false)
  /** One object URL per shown photo, by attachment id. */
  const urls = reactive(new Map<string, string>())
  const remaining = computed(() => ATTACHMENTS_PER_EXAM - stored.value.length - local.value.length)
  let stopWatching: (() => void) | undefined

  function revoke(id: string) {
    const url = urls.get(id)
    if (url && typeof URL.revokeObjectURL === 'function') URL.revokeObjectURL(url)
    urls.delete(id)
  }

  /** Keeps one object URL per shown photo, and lets go of those no longer shown. */
  function keepUrlsFor(ids: Set<string>) {
    for (const id of [...urls.keys()]) if (!ids.has(id)) revoke(id)
  }

  async function loadStored() {
    const id = examId.value
    if (!id) return
    const notYet = !!session.user && (await notOnServerYet(id, session.user.id).catch(() => false))
    if (examId.value !== id) return
    if (notYet) {
      stored.value = []
      return
    }
    try {
      const list = await fetchAttachments(id)
      if (examId.value !== id) return
      stored.value = list
      storedNote.value = ''
    } catch (e) {
      const error = await readApiError(e)
      // 404: the exam is not on the server yet (a bedside draft); its photos wait on this device.
      if (error.status !== 404) storedNote.value = error.status === null ? 'Photos already sent show here once the server can be reached.' : error.message
      stored.value = []
    }
    keepUrlsFor(new Set([...stored.value.map((a) => a.id), ...local.value.map((a) => a.id)]))
    for (const attachment of stored.value) {
      if (urls.has(attachment.id)) continue
      const blob = await fetchAttachmentBlob(attachment.id).catch(() => null)
      if (blob && examId.value === id) urls.set(attachment.id, objectUrl(blob))
    }
  }

  function showLocal(rows: LocalAttachment[]) {
    const before = local.value.length
    local.value = rows
    keepUrlsFor(new Set([...stored.value.map((a) => a.id), ...rows.map((a) => a.id)]))
    for (const row of rows) if (!urls.has(row.id)) urls.set(row.id, objectUrl(row.blob))
    // Fewer waiting on the device: some were sent, so the server's list grew.
    if (rows.length < before) void loadStored()
  }

  /** Shows the photos of one exam; `editable` also asks whether the hospital allows photos. Settles once the server's list is in. */
  function open(id: string, editable: boolean): Promise<void> {
    stopWatching?.()
    examId.value = id
    local.value = []
    stored.value = []
    storedNote.value = ''
    problems.value = []
    stopWatching = watchLocalAttachments(id, showLocal)
    if (editable) void fetchPhotosAllowed().then((value) => (allowed.value = value), () => undefined)
    return loadStored()
  }

  /** Stops watching and lets go of every object URL. */
  function close() {
    stopWatching?.()
    examId.value = null
    allowed.value = null
    for (const id of [...urls.keys()]) revoke(id)
  }

  /** Keeps the chosen files on this device for sending (consent ticked), then lets sync try. */
  async function add(files: File[], consent: boolean) {
    problems.value = []
    if (!files.length || !session.user || !examId.value) return
    busy.value = true
    try {
      const result = await addLocalPhotos(examId.value, session.user.id, files, { consent, storedCount: stored.value.length })
      problems.value = result.problems
      if (result.added.length) void sync.syncNow()
    } catch (e) {
      problems.value = [storageProblem(e).replace('Not queued for the server', 'Photo not kept')]
    } finally {
      busy.value = false
    }
  }

  async function removeStored(attachment: Attachment) {
    problems.value = []
    try {
      await deleteAttachment(attachment.id)
      await loadStored()
    } catch (e) {
      problems.value = [(await readApiError(e)).message]
    }
  }

  const removeLocal = (id: string) => removeLocalPhoto(id)

  async function retry(row: LocalAttachment) {
    await retryLocalPhoto(row.id)
    void sync.syncNow()
  }

  return { examId, local, stored, storedNote, allowed, problems, busy, urls, remaining, open, close, add, removeStored, removeLocal, retry }
})

import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { ExamListQuerySchema, type Exam, type ExamListQuery } from '#shared/schemas/exam'
import { serverUnreachable } from '@/api/client'
import { fetchExam, fetchExams, submitExam, updateExam } from '@/api/exams'
import type { UnsentState } from '@/db/local-exam-list'
import { nextTask } from '@/utils/tasks'
import { useSessionStore } from './session'

export type ExamFilters = Pick<ExamListQuery, 'status' | 'patientCode' | 'from' | 'to'>
export type ExamPaging = Pick<ExamListQuery, 'page' | 'pageSize' | 'sort' | 'order'>

const NO_FILTERS: ExamFilters = { status: undefined, patientCode: undefined, from: undefined, to: undefined }

// The device database (Dexie, with several long tasks to start) loads only when the log needs it: for the marks of
// unsent exams, which may follow the first rows, and for the copies shown while the server cannot be reached.
const localExamList = () => import('@/db/local-exam-list')

/** The device's outbox must never break the log: without it, rows simply carry no "not yet sent" mark. */
async function unsentOrNone(userId: string | undefined): Promise<Record<string, UnsentState>> {
  if (!userId) return {}
  return localExamList()
    .then((db) => db.unsentExams(userId))
    .catch(() => ({}))
}

/** The page of the log read from this device's copies, with when the device last synced. */
async function deviceList(userId: string, q: ExamListQuery) {
  const [{ listLocalExams }, { loadLastSync }] = await Promise.all([localExamList(), import('@/db/meta')])
  const list = { ...(await listLocalExams(userId, q)), totalCapped: false, nextCursor: null }
  return { list, local: true, syncedAt: await loadLastSync(userId) }
}

export const useExamsStore = defineStore('exams', () => {
  /** The page of the log on screen. */
  const exams = ref<Exam[]>([])
  /** How many exams match the filters on the server, counted up to a cap. */
  const total = ref(0)
  /** More exams match than `total` says: the log shows "10,000+". */
  const totalCapped = ref(false)
  /**
   * The server's cursor for each page after the first, from the page before it (same filters, sort and page size):
   * a page reached through it costs the server the same however deep it is.
   */
  const cursors = ref<Record<number, string>>({})
  /** Filters, sort and page of the log; kept while the user visits a record and comes back. */
  const query = ref<ExamListQuery>(ExamListQuerySchema.parse({}))
  const loading = ref(false)
  /** The exam open on the detail page. */
  const current = ref<Exam | null>(null)
  const submitting = ref(false)
  /** The log shows the copies kept on this device because the server could not be reached. */
  const fromDevice = ref(false)
  /** When this device last synced with the server, shown with a log read from the device; null if it never did. */
  const deviceSyncedAt = ref<string | null>(null)
  /** The user's exams with changes saved on this device that the server has not acknowledged. */
  const unsent = ref<Record<string, UnsentState>>({})
  let latestRequest = 0

  async function fetchList(q: ExamListQuery) {
    try {
      const list = await fetchExams({ ...q, cursor: q.page > 1 ? cursors.value[q.page] : undefined })
      return { list, local: false, syncedAt: null }
    } catch (e) {
      const userId = useSessionStore().user?.id
      // Only a missing network falls back; a refusal from the server is an answer to show.
      if (!serverUnreachable(e) || !userId) throw e
      return deviceList(userId, q)
    }
  }

  const hasFilters = computed(() => Object.keys(NO_FILTERS).some((key) => query.value[key as keyof ExamFilters]))

  /** Loads the page of the log that `query` describes; an older answer never overwrites a newer one. */
  async function loadList() {
    const request = ++latestRequest
    loading.value = true
    try {
      const asked = query.value
      const { list, local, syncedAt } = await fetchList(asked)
      // The rows render in a task after the one that read and checked the answer: two shorter tasks on a phone.
      await nextTask()
      if (request !== latestRequest) return
      exams.value = list.exams
      total.value = list.total
      totalCapped.value = list.totalCapped
      if (list.nextCursor) cursors.value = { ...cursors.value, [asked.page + 1]: list.nextCursor }
      fromDevice.value = local
      deviceSyncedAt.value = syncedAt
    } finally {
      if (request === latestRequest) loading.value = false
    }
    // after the rows, so the device database never holds them back
    const unsentNow = await unsentOrNone(useSessionStore().user?.id)
    if (request === latestRequest) unsent.value = unsentNow
  }

  /** Replaces the filters and goes back to the first page. */
  function setFilters(filters: Partial<ExamFilters>) {
    query.value = { ...query.value, ...NO_FILTERS, ...filters, page: 1 }
    cursors.value = {}
  }

  /** Applies the table's page and sort; returns whether anything changed, so callers reload only then. */
  function setPaging(paging: ExamPaging): boolean {
    const current = query.value
    const changed = (Object.keys(paging) as (keyof ExamPaging)[]).some((key) => current[key] !== paging[key])
    if (changed) query.value = { ...current, ...paging }
    // A cursor continues one order at one page size only.
    if (paging.sort !== current.sort || paging.order !== current.order || paging.pageSize !== current.pageSize) cursors.value = {}
    return changed
  }

  /** Loads one exam for the detail page. */
  async function loadExam(id: string) {
    if (current.value?.id !== id) current.value = null
    try {
      current.value = await fetchExam(id)
    } catch (e) {
      const userId = useSessionStore().user?.id
      const local = serverUnreachable(e) && userId ? await (await import('@/db/local-exams')).loadLocalExam(id, userId) : undefined
      if (!local) throw e
      current.value = local
    }
  }

  /**
   * Records on the server that the examiner confirmed the column is venous, with the band on screen as the one
   * reviewed (so the record says so should the server's band differ).
   */
  async function confirmVenous(exam: Exam) {
    const { bandCmH2O, observerSource, settingsVersion } = exam.estimate
    const reviewed = settingsVersion === undefined ? { bandCmH2O, observerSource } : { bandCmH2O, observerSource, settingsVersion }
    return updateExam(exam.id, { baseVersion: exam.version, venousConfirmed: true, reviewed })
  }

  /**
   * Sends the open exam for countersignature and keeps the server's new copy; with `confirmVenous`, first records the
   * examiner's confirmation that the column is venous (required when arterial evidence was recorded).
   */
  async function submit(id: string, options: { confirmVenous?: boolean } = {}) {
    submitting.value = true
    try {
      if (options.confirmVenous && current.value?.id === id) current.value = await confirmVenous(current.value)
      const exam = await submitExam(id)
      current.value = exam
      exams.value = exams.value.map((row) => (row.id === id ? exam : row))
    } finally {
      submitting.value = false
    }
  }

  return {
    exams,
    total,
    totalCapped,
    cursors,
    query,
    loading,
    current,
    submitting,
    fromDevice,
    deviceSyncedAt,
    unsent,
    hasFilters,
    loadList,
    setFilters,
    setPaging,
    loadExam,
    submit,
  }
})

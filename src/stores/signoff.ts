import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { Exam } from '#shared/schemas/exam'
import type { CountersignInput, ReturnInput } from '#shared/schemas/signature'
import type { SignoffQueueItem, SignoffQueueOrder, SignoffQueueResident } from '#shared/schemas/signoff-queue'
import * as supervision from '@/api/supervision'
import { useExamsStore } from './exams'

export const useSignoffStore = defineStore('signoff', () => {
  /** The page of the attending's queue on screen, in `order`. */
  const items = ref<SignoffQueueItem[]>([])
  const order = ref<SignoffQueueOrder>('oldest')
  /** Part of a resident's name or a patient code; empty for the whole queue. */
  const search = ref('')
  /** The resident whose exams alone are shown; null for everyone. */
  const residentId = ref<string | null>(null)
  /** Everyone with exams waiting, with how many, for the filter chips. */
  const residents = ref<SignoffQueueResident[]>([])
  const total = ref(0)
  const page = ref(1)
  const pageSize = ref(25)
  const loading = ref(false)
  /** How many exams wait for the attending, for the nav badge; null until first heard. */
  const count = ref<number | null>(null)
  /** The signed-in author's exams that came back with a comment. */
  const returned = ref<Exam[]>([])
  const exams = useExamsStore()

  /** Loads a page of the queue in the order, search and resident chosen; an unfiltered total also refreshes the badge. */
  async function loadQueue(paging: { page?: number; pageSize?: number } = {}) {
    page.value = paging.page ?? page.value
    pageSize.value = paging.pageSize ?? pageSize.value
    loading.value = true
    try {
      const q = search.value.trim()
      const filters = { order: order.value, q: q || undefined, residentId: residentId.value ?? undefined }
      const queue = await supervision.fetchSignoffQueue({ page: page.value, pageSize: pageSize.value, ...filters })
      items.value = queue.items
      total.value = queue.total
      if (!filters.q && !filters.residentId && !queue.totalCapped) count.value = queue.total
    } finally {
      loading.value = false
    }
  }

  /** Loads how many exams each resident has waiting. */
  async function loadResidents() {
    residents.value = await supervision.fetchSignoffResidents()
  }

  /** Asks the server how many exams wait; never throws, since the badge is a hint and must not block anything. */
  async function refreshCount() {
    try {
      count.value = await supervision.fetchSignoffCount()
    } catch {
      // keep the last known count: offline or signed out, the next poll tries again
    }
  }

  /** Takes the server's copy after a sign-off action: it leaves the queue and replaces the exam on screen. */
  function settle(exam: Exam) {
    const before = items.value.length
    items.value = items.value.filter((item) => item.exam.id !== exam.id)
    if (items.value.length < before) {
      total.value = Math.max(0, total.value - 1)
      residents.value = residents.value
        .map((r) => (r.residentId === exam.examinerId ? { ...r, count: r.count - 1 } : r))
        .filter((r) => r.count > 0)
    }
    if (exams.current?.id === exam.id) exams.current = exam
    returned.value = returned.value.filter((row) => row.id !== exam.id || exam.status === 'returned')
    return exam
  }

  /** Countersigns with the attending's password; rejects with the ky error (401 `signature-password` on a wrong password). */
  async function countersign(id: string, input: CountersignInput) {
    const exam = settle(await supervision.countersignExam(id, input))
    void refreshCount()
    return exam
  }

  /** Sends a submitted exam back to its author with a comment. */
  async function returnWithComment(id: string, input: ReturnInput) {
    const exam = settle(await supervision.returnExam(id, input))
    void refreshCount()
    return exam
  }

  /** Reopens the author's returned or countersigned exam as a draft; a countersignature becomes superseded. */
  async function amend(id: string, baseVersion?: number) {
    return settle(await supervision.amendExam(id, { baseVersion }))
  }

  /** Loads the author's returned exams for the banner above their log. */
  async function loadReturned(examinerId: string) {
    returned.value = returned.value.filter((exam) => exam.examinerId === examinerId)
    returned.value = await supervision.fetchReturnedExams(examinerId)
  }

  return {
    items,
    order,
    search,
    residentId,
    residents,
    total,
    page,
    pageSize,
    loading,
    count,
    returned,
    loadQueue,
    loadResidents,
    refreshCount,
    countersign,
    returnWithComment,
    amend,
    loadReturned,
  }
})

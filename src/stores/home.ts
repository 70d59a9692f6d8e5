import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { SignoffQueueItem } from '#shared/schemas/signoff-queue'
import { fetchSignoffQueue } from '@/api/supervision'
import { listDrafts } from '@/db/drafts'
import type { DraftRow } from '@/db/draft-schema'

/** How many waiting exams the home page names before pointing to the queue. */
export const HOME_WAITING_SHOWN = 3

export const useHomeStore = defineStore('home', () => {
  /** Exams begun on this device and not yet saved to the log, the latest change first. */
  const drafts = ref<DraftRow[]>([])
  /** The longest-waiting exams of the attending's queue. */
  const waiting = ref<SignoffQueueItem[]>([])
  /** How many exams wait for the attending in all; null until heard. */
  const waitingTotal = ref<number | null>(null)

  /** Reads this device's unsaved drafts. */
  async function loadDrafts() {
    drafts.value = await listDrafts('editing')
  }

  /** Reads the first few exams of the sign-off queue and how many wait. */
  async function loadWaiting() {
    const queue = await fetchSignoffQueue({ page: 1, pageSize: HOME_WAITING_SHOWN, order: 'oldest' })
    waiting.value = queue.items
    waitingTotal.value = queue.total
  }

  return { drafts, waiting, waitingTotal, loadDrafts, loadWaiting }
})

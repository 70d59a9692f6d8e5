import { defineStore } from 'pinia'
import { ref, watch } from 'vue'
import type { User } from '#shared/schemas/user'
import { loadLastSync, saveLastSync } from '@/db/meta'
import { outboxCounts } from '@/db/outbox'
import { useSessionStore } from './session'
import { syncAs } from './sync-cycle'

// The one retry path for the outbox: backoff after a failure, and a new cycle on the `online` event. The service worker
// replays nothing itself (no Background Sync), so a push is never sent twice by two engines.
const RETRY_BASE_MS = 2_000
const RETRY_CAP_MS = 2 * 60_000

const syncs = (user: User) => user.roles.some((role) => role !== 'admin')

export const useSyncStore = defineStore('sync', () => {
  const session = useSessionStore()
  /** The browser's view of the network; the server may still be out of reach while it says online. */
  const online = ref(typeof navigator === 'undefined' || navigator.onLine)
  const syncing = ref(false)
  /** The signed-in user's exams that the server has not acknowledged yet. */
  const unsynced = ref(0)
  /** Changes the server refused or found in conflict: they wait for the user. */
  const attention = ref(0)
  const lastSyncAt = ref<string | null>(null)
  /** The session ended: the outbox is kept and nothing is sent until the user signs in again. */
  const needsSignIn = ref(false)
  const lastError = ref<string | null>(null)
  /** When the next attempt runs after a failure (ms since the epoch); null when none is planned. */
  const retryAt = ref<number | null>(null)
  let failures = 0
  let retryTimer: ReturnType<typeof setTimeout> | undefined
  let running: Promise<void> | null = null
  let again = false
  let started = false

  /** Re-reads the counts shown in the app bar. */
  async function refreshCounts() {
    const id = session.user?.id
    const counts = id ? await outboxCounts(id) : { unsynced: 0, attention: 0 }
    unsynced.value = counts.unsynced
    attention.value = counts.attention
    lastSyncAt.value = id ? await loadLastSync(id) : null
  }

  function scheduleRetry() {
    failures += 1
    const delay = Math.min(RETRY_CAP_MS, RETRY_BASE_MS * 2 ** (failures - 1))
    retryAt.value = Date.now() + delay
    retryTimer = setTimeout(() => void syncNow(), delay)
  }

  async function cycle() {
    const user = session.user
    stop()
    if (!user || !syncs(user) || !online.value) return refreshCounts()
    syncing.value = true
    try {
      const error = await syncAs(user.id, session)
      needsSignIn.value = error?.status === 401
      lastError.value = error?.message ?? null
      if (!error) {
        failures = 0
        await saveLastSync(user.id, new Date().toISOString())
      } else if (error.status !== 401) scheduleRetry()
    } finally {
      syncing.value = false
      await refreshCounts()
    }
  }

  /** Sends the outbox and pulls the server's changes now; a call during a run makes it run once more. */
  function syncNow(): Promise<void> {
    if (running) {
      again = true
      return running
    }
    running = (async () => {
      do {
        again = false
        await cycle()
      } while (again)
    })().finally(() => (running = null))
    return running
  }

  /** Syncs on start, when the network comes back and when someone signs in; call once, from the app shell. */
  function start() {
    if (started) return
    started = true
    window.addEventListener('online', () => {
      online.value = true
      failures = 0
      void syncNow()
    })
    window.addEventListener('offline', () => (online.value = false))
    watch(() => [session.user?.id, session.token], () => void (syncing.value || syncNow()), { immediate: true })
  }

  /** Cancels a planned retry. */
  function stop() {
    clearTimeout(retryTimer)
    retryAt.value = null
  }

  return { online, syncing, unsynced, attention, lastSyncAt, needsSignIn, lastError, retryAt, refreshCounts, syncNow, start, stop }
})

import { defineStore } from 'pinia'
import { ref } from 'vue'
import { keepMine as keepMineHere, listConflicts, listRefusals, takeServer as takeServerHere, type Conflict, type Refusal } from '@/db/conflicts'
import { useSessionStore } from './session'
import { useSyncStore } from './sync'

export const useSyncConflictsStore = defineStore('sync-conflicts', () => {
  const session = useSessionStore()
  const sync = useSyncStore()
  /** The signed-in user's exams changed both on this device and on the server. */
  const conflicts = ref<Conflict[]>([])
  /** Changes the server refused (invalid, locked, forbidden); fixed by editing the exam and saving it again. */
  const refusals = ref<Refusal[]>([])
  const loaded = ref(false)

  async function load() {
    conflicts.value = session.user ? await listConflicts(session.user.id) : []
    refusals.value = session.user ? await listRefusals(session.user.id) : []
    loaded.value = true
  }

  /** Sends the local version as a change on top of the server's; false when refused (the server's is signed or submitted). */
  async function keepMine(seq: number) {
    const queued = await keepMineHere(seq)
    if (queued) await sync.syncNow()
    await load()
    return queued
  }

  /** Replaces the local version with the server's. */
  async function takeServer(seq: number) {
    await takeServerHere(seq)
    await sync.refreshCounts()
    await load()
  }

  return { conflicts, refusals, loaded, load, keepMine, takeServer }
})

import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { RoundCreateInput, RoundDetail, RoundResults, RoundSummary } from '#shared/schemas/round'
import * as rounds from '@/api/rounds'
import { useSessionStore } from './session'

export const useRoundsStore = defineStore('rounds', () => {
  const session = useSessionStore()
  /** The rounds the signed-in user created or examines in, open ones first. */
  const list = ref<RoundSummary[]>([])
  const loading = ref(false)
  /** The round on screen, and its results once it is closed. */
  const current = ref<RoundDetail | null>(null)
  const results = ref<RoundResults | null>(null)

  /** Open rounds the signed-in user examines in: what the bedside flow offers. */
  const openToRecord = computed(() =>
    list.value.filter((r) => r.status === 'open' && r.examiners.some((e) => e.id === session.user?.id)),
  )

  async function load() {
    loading.value = true
    try {
      list.value = await rounds.fetchRounds()
    } finally {
      loading.value = false
    }
  }

  /** Loads the list for the bedside picker; offline or refused, it keeps what it had and never throws. */
  async function loadQuietly() {
    try {
      list.value = await rounds.fetchRounds()
    } catch {
      // the picker then offers the rounds known from earlier in this session, if any
    }
  }

  /** Loads one round and, when it is closed, its results. */
  async function open(id: string) {
    if (current.value?.id !== id) {
      current.value = null
      results.value = null
    }
    const detail = await rounds.fetchRound(id)
    current.value = detail
    results.value = detail.status === 'closed' ? await rounds.fetchRoundResults(id) : null
  }

  /** Creates a round; rejects with the ky error (400 with field errors on bad input). */
  async function create(input: RoundCreateInput) {
    const created = await rounds.createRound(input)
    list.value = [created, ...list.value.filter((r) => r.id !== created.id)]
    return created
  }

  /** Closes the round on screen and loads its results. */
  async function close(id: string) {
    current.value = await rounds.closeRound(id)
    list.value = list.value.map((r) => (r.id === id ? { ...r, status: 'closed', closedAt: current.value!.closedAt } : r))
    results.value = await rounds.fetchRoundResults(id)
  }

  return { list, loading, current, results, openToRecord, load, loadQuietly, open, create, close }
})

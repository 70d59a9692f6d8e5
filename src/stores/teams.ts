import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { Team } from '#shared/schemas/user'
import { fetchTeams } from '@/api/teams'

export const useTeamsStore = defineStore('teams', () => {
  const teams = ref<Team[]>([])
  const loading = ref(false)

  /** Loads the teams visible to the signed-in user. */
  async function load() {
    loading.value = true
    try {
      teams.value = await fetchTeams()
    } finally {
      loading.value = false
    }
  }

  return { teams, loading, load }
})

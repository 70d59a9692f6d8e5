import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { User } from '#shared/schemas/user'
import { fetchUsers } from '@/api/admin'

export const useAccountsStore = defineStore('accounts', () => {
  const users = ref<User[]>([])
  const loading = ref(false)

  /** Loads every account; admin only. */
  async function load() {
    loading.value = true
    try {
      users.value = await fetchUsers()
    } finally {
      loading.value = false
    }
  }

  return { users, loading, load }
})

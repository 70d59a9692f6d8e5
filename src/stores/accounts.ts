import { defineStore } from 'pinia'
import { ref } from 'vue'
import type { Account, AccountPatch, InviteInput } from '#shared/schemas/account'
import type { User } from '#shared/schemas/user'
import { fetchUsers } from '@/api/admin'
import {
  deactivateAccount,
  fetchAccounts,
  inviteAccount,
  reactivateAccount,
  resendInvitation,
  updateAccount,
  type AccountFilters,
} from '@/api/accounts'

export const useAccountsStore = defineStore('accounts', () => {
  /** Every account, unpaged: the audit trail's actor picker. */
  const users = ref<User[]>([])
  const loading = ref(false)

  /** One page of the admin's account list and the filters that produced it. */
  const accounts = ref<Account[]>([])
  const total = ref(0)
  const filters = ref<AccountFilters>({ page: 1, pageSize: 25 })
  const pageLoading = ref(false)

  /** Loads every account; admin only. */
  async function load() {
    loading.value = true
    try {
      users.value = await fetchUsers()
    } finally {
      loading.value = false
    }
  }

  /** Loads the page for the given filters (merged into the current ones). */
  async function loadPage(next: AccountFilters = {}) {
    filters.value = { ...filters.value, ...next }
    pageLoading.value = true
    try {
      const page = await fetchAccounts(filters.value)
      accounts.value = page.accounts
      total.value = page.total
    } finally {
      pageLoading.value = false
    }
  }

  function replace(account: Account) {
    accounts.value = accounts.value.map((a) => (a.id === account.id ? account : a))
    return account
  }

  async function invite(input: InviteInput) {
    const account = await inviteAccount(input)
    await loadPage()
    return account
  }

  const update = async (id: string, patch: AccountPatch) => replace(await updateAccount(id, patch))
  const deactivate = async (id: string) => replace(await deactivateAccount(id))
  const reactivate = async (id: string) => replace(await reactivateAccount(id))
  const resend = async (id: string) => replace(await resendInvitation(id))

  return { users, loading, load, accounts, total, filters, pageLoading, loadPage, invite, update, deactivate, reactivate, resend }
})

import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { isHTTPError } from 'ky'
import type { LoginInput, Role, User } from '#shared/schemas/user'
import * as auth from '@/api/auth'
import { setToken } from '@/api/token'

export const useSessionStore = defineStore('session', () => {
  const user = ref<User | null>(null)
  /** Access token; memory only, the refresh cookie survives reloads instead. */
  const token = ref<string | null>(null)
  /** True when the server runs on invented demo data. */
  const demo = ref(false)
  const restored = ref(false)
  let restoring: Promise<void> | null = null

  const signedIn = computed(() => user.value !== null)

  function applySession(session: { token: string; user: User } | null) {
    token.value = session?.token ?? null
    user.value = session?.user ?? null
    setToken(token.value)
  }

  async function loadDemoFlag() {
    demo.value = await auth.fetchHealth().then((h) => h.demo).catch(() => false)
  }

  async function refreshSession() {
    try {
      applySession(await auth.refresh())
    } catch (e) {
      // 401 just means nobody is signed in; anything else also leaves us signed out
      if (!isHTTPError(e) || e.response.status !== 401) console.warn('Session restore failed', e)
      applySession(null)
    }
  }

  /** Restores the session from the refresh cookie; runs once per app start. */
  function restore() {
    restoring ??= Promise.all([refreshSession(), loadDemoFlag()]).then(() => {
      restored.value = true
    })
    return restoring
  }

  /** Signs in; rejects with the ky error so callers can show the server's message. */
  async function signIn(email: string, password: string) {
    const input: LoginInput = { email, password }
    applySession(await auth.login(input))
  }

  /** Signs out locally even if the server cannot be reached. */
  async function signOut() {
    try {
      await auth.logout()
    } finally {
      applySession(null)
    }
  }

  /** True when the user holds at least one of the given roles. */
  function hasRole(...roles: Role[]) {
    return roles.some((role) => user.value?.roles.includes(role) ?? false)
  }

  return { user, token, demo, restored, signedIn, restore, signIn, signOut, hasRole }
})

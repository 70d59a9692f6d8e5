import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { isHTTPError } from 'ky'
import type { LoginInput, Role, User } from '#shared/schemas/user'
import * as auth from '@/api/auth'
import { accessToken } from '@/api/token'
import { lastKnownDemo, rememberDemo } from '@/utils/demo-flag'
import type { unsyncedWorkOnDevice } from '@/db/outbox'

export type RenewOutcome = 'renewed' | 'refused' | 'unreachable'
/** What signing out would destroy: queued changes and unfinished exams on this device. */
export type UnsyncedWork = Awaited<ReturnType<typeof unsyncedWorkOnDevice>>

// The device database (Dexie and the schemas of what it keeps) loads only when a session needs it: the first page a
// visitor opens, sign-in, is smaller without it.
const deviceMeta = () => import('@/db/meta')

export const useSessionStore = defineStore('session', () => {
  const user = ref<User | null>(null)
  /** Access token; memory only, the refresh cookie survives reloads instead. */
  const token = accessToken
  /** True when the server runs on invented demo data. */
  const demo = ref(false)
  const restored = ref(false)
  let restoring: Promise<void> | null = null

  const signedIn = computed(() => user.value !== null)

  function applySession(session: { token: string; user: User } | null) {
    token.value = session?.token ?? null
    user.value = session?.user ?? null
    if (session) void deviceMeta().then((meta) => meta.saveProfile(session.user)).catch(() => undefined)
  }

  async function loadDemoFlag() {
    demo.value = await auth
      .fetchHealth()
      .then((h) => (rememberDemo(h.demo), h.demo))
      .catch(lastKnownDemo)
  }

  async function refreshSession() {
    try {
      applySession(await auth.refresh())
    } catch (e) {
      // 401: the cookie was refused (expired, revoked); another answer also leaves us signed out
      if (isHTTPError(e) && e.response.status !== 401) console.warn('Session restore failed', e)
      applySession(null)
      // No answer at all (offline start): carry on with the profile kept on this device; sync gets a token later.
      if (!isHTTPError(e)) user.value = await deviceMeta().then((meta) => meta.loadProfile()).catch(() => null)
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

  /** A fresh access token from the refresh cookie, taken only if it is still the same account's (sync after a 401). */
  async function renew(userId: string): Promise<RenewOutcome> {
    try {
      const session = await auth.refresh()
      if (session?.user.id !== userId) return 'refused'
      applySession(session)
      return 'renewed'
    } catch (e) {
      return isHTTPError(e) ? 'refused' : 'unreachable'
    }
  }

  /**
   * Signs out and wipes what this device holds (drafts, exam copies, outbox, photos), so no patient code stays on a shared
   * phone. With work not yet on the server it does nothing and answers that work, unless the user accepted the loss.
   */
  async function signOut(options: { discardUnsynced?: boolean } = {}): Promise<UnsyncedWork | null> {
    const [{ unsyncedWorkOnDevice }, { wipeLocalData }] = await Promise.all([import('@/db/outbox'), import('@/db/wipe')])
    const work = await unsyncedWorkOnDevice()
    if (!options.discardUnsynced && work.changes + work.drafts + work.photos > 0) return work
    // Signs out locally even if the server cannot be reached.
    await auth.logout().catch(() => undefined)
    applySession(null)
    await wipeLocalData()
    return null
  }

  /** True when the user holds at least one of the given roles. */
  function hasRole(...roles: Role[]) {
    return roles.some((role) => user.value?.roles.includes(role) ?? false)
  }

  return { user, token, demo, restored, signedIn, restore, signIn, renew, signOut, hasRole }
})

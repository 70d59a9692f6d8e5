import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { isHTTPError } from 'ky'
import type { LoginInput, Role, User } from '#shared/schemas/user'
import * as auth from '@/api/auth'
import { accessToken } from '@/api/token'
import { lastKnownDemo, rememberDemo } from '@/utils/demo-flag'
import { whenIdle } from '@/plugins/idle'
import type { unsyncedWorkOnDevice } from '@/db/outbox'

export type RenewOutcome = 'renewed' | 'refused' | 'unreachable'
/** What signing out would destroy: queued changes and unfinished exams on this device. */
export type UnsyncedWork = Awaited<ReturnType<typeof unsyncedWorkOnDevice>>

// The device database (Dexie and the schemas of what it keeps) loads only when a session needs it: the first page a
// visitor opens, sign-in, is smaller without it.
const deviceMeta = () => import('@/db/meta')

// Whether this browser held a session when the app last saw it: no secret (the refresh cookie stays HttpOnly), only
// whether a public page such as sign-in should wait for the refresh call before it renders.
const HAD_SESSION_KEY = 'plumbline.had-session'

function hadSession(): boolean {
  try {
    return localStorage.getItem(HAD_SESSION_KEY) === 'yes'
  } catch {
    return true
  }
}

function noteSession(had: boolean) {
  try {
    if (had) localStorage.setItem(HAD_SESSION_KEY, 'yes')
    else localStorage.removeItem(HAD_SESSION_KEY)
  } catch {
    // storage refused: public pages then wait for the refresh call, as without the hint
  }
}

export const useSessionStore = defineStore('session', () => {
  const user = ref<User | null>(null)
  /** Access token; memory only, the refresh cookie survives reloads instead. */
  const token = accessToken
  /** True when the server runs on invented demo data. */
  const demo = ref(false)
  const restored = ref(false)
  let restoring: Promise<void> | null = null
  // Bumped by every change of session, so a refresh answer that arrives after a sign-in does not undo it.
  let sessionChanges = 0

  const signedIn = computed(() => user.value !== null)

  function applySession(session: { token: string; user: User } | null) {
    sessionChanges += 1
    token.value = session?.token ?? null
    user.value = session?.user ?? null
    if (!session) return
    keepProfile(session.user)
    noteSession(true)
  }

  // For the next offline start. Opening the device database costs several long tasks, so it waits until the first page
  // is up and the browser idle, and is skipped if the account changed meanwhile (signed out).
  function keepProfile(profile: User) {
    whenIdle(() => {
      if (user.value?.id !== profile.id) return
      void deviceMeta()
        .then((meta) => meta.saveProfile(profile))
        .catch(() => undefined)
    })
  }

  async function loadDemoFlag() {
    demo.value = await auth
      .fetchHealth()
      .then((h) => (rememberDemo(h.demo), h.demo))
      .catch(lastKnownDemo)
  }

  async function refreshSession() {
    const before = sessionChanges
    try {
      const session = await auth.refresh()
      if (sessionChanges !== before) return
      if (!session) noteSession(false)
      applySession(session)
    } catch (e) {
      if (sessionChanges !== before) return
      // 401: the cookie was refused (expired, revoked); another answer also leaves us signed out
      if (isHTTPError(e) && e.response.status !== 401) console.warn('Session restore failed', e)
      applySession(null)
      if (isHTTPError(e)) return noteSession(false)
      // No answer at all (offline start): carry on with the profile kept on this device; sync gets a token later.
      const kept = await deviceMeta().then((meta) => meta.loadProfile()).catch(() => null)
      if (sessionChanges === before + 1) user.value = kept
    }
  }

  /**
   * Restores the session from the refresh cookie; runs once per app start, and later calls get the first one's promise.
   * With `publicPage` (the app opens at sign-in, say) in a browser that had no session when last seen, it resolves
   * once the demo flag is known and the refresh answer lands whenever it comes, so the page does not wait for it.
   */
  function restore(options: { publicPage?: boolean } = {}) {
    if (restoring) return restoring
    const demoKnown = loadDemoFlag()
    const all = Promise.all([refreshSession(), demoKnown]).then(() => {
      restored.value = true
    })
    restoring = options.publicPage && !hadSession() ? demoKnown : all
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
    noteSession(false)
    await wipeLocalData()
    return null
  }

  /** True when the user holds at least one of the given roles. */
  function hasRole(...roles: Role[]) {
    return roles.some((role) => user.value?.roles.includes(role) ?? false)
  }

  return { user, token, demo, restored, signedIn, restore, signIn, renew, signOut, hasRole }
})

import { inject, ref, type App, type InjectionKey, type Ref } from 'vue'
import type { Router } from 'vue-router'
import type { RegisterSWOptions } from 'vite-plugin-pwa/types'
import { createInstallPrompt, installPromptKey } from '@/components/pwa/install-prompt'
import { askForPersistentStorage } from '@/composables/storage-status'
import { whenIdle } from './idle'

type RegisterSW = (options: RegisterSWOptions) => (reloadPage?: boolean) => Promise<void>

export interface AppUpdate {
  /** A new version is installed and waits for the user's go-ahead. */
  needRefresh: Ref<boolean>
  /** The user chose "Later"; the prompt returns at the next start or the next new version. */
  postponed: Ref<boolean>
  start(): Promise<void>
  /** Activates the waiting version; the page reloads only as a result of this call. */
  update(): Promise<void>
  later(): void
}

export const appUpdateKey: InjectionKey<AppUpdate> = Symbol('app-update')

const UPDATE_CHECK_MS = 60 * 60 * 1000

// https://vite-pwa-org.netlify.app/guide/periodic-sw-updates
function checkForUpdatesHourly(registration: ServiceWorkerRegistration) {
  setInterval(() => {
    // offline or mid-install the check can only fail or race the running install
    if (!navigator.onLine || registration.installing) return
    registration.update().catch(() => undefined)
  }, UPDATE_CHECK_MS)
}

/** The service worker's update state; `load` resolves to `registerSW` so tests can pass a fake. */
export function createAppUpdate(load: () => Promise<RegisterSW>, reload = () => window.location.reload()): AppUpdate {
  const needRefresh = ref(false)
  const postponed = ref(false)
  let updateSW: ((reloadPage?: boolean) => Promise<void>) | undefined
  let userAsked = false
  let alreadyControlled = false

  function showPrompt() {
    needRefresh.value = true
    postponed.value = false
  }

  async function start() {
    const registerSW = await load()
    updateSW = registerSW({
      onNeedRefresh: showPrompt,
      // Another tab's "Update now" also hands this tab to the new worker: keep its form, ask instead of reloading.
      onNeedReload: () => {
        if (userAsked) return reload()
        alreadyControlled = true
        showPrompt()
      },
      onRegisteredSW: (_url, registration) => registration && checkForUpdatesHourly(registration),
      onRegisterError: (error) => console.warn('Service worker registration failed', error),
    })
  }

  async function update() {
    if (alreadyControlled) return reload()
    userAsked = true
    await updateSW?.(true)
  }

  return { needRefresh, postponed, start, update, later: () => (postponed.value = true) }
}

/** The app's update state; inert outside the app (component tests, dev server). */
export function useAppUpdate(): AppUpdate {
  return inject(appUpdateKey, () => createAppUpdate(async () => () => async () => undefined), true)
}

/**
 * Registers the service worker after the first navigation, so its precache download never competes with the
 * first screen, and asks once per start for persistent storage when a signed-in page first opens.
 */
export function installPwa(app: App, router: Router) {
  const appUpdate = createAppUpdate(() => import('virtual:pwa-register').then((m) => m.registerSW))
  app.provide(appUpdateKey, appUpdate)
  app.provide(installPromptKey, createInstallPrompt(window))
  if (import.meta.env.PROD && 'serviceWorker' in navigator) {
    const register = () => appUpdate.start().catch((error) => console.warn('Service worker registration failed', error))
    // Its precache download (every route chunk) waits until the first page is on screen and the browser is idle. A
    // failed first navigation is the case where the offline shell helps most: register anyway.
    const registerWhenIdle = () => whenIdle(register)
    void router.isReady().then(registerWhenIdle, registerWhenIdle)
  }
  const stopAsking = router.afterEach((to) => {
    if (to.meta.public) return
    stopAsking()
    void askForPersistentStorage()
  })
}

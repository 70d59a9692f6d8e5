import { computed, inject, shallowRef, type ComputedRef, type InjectionKey } from 'vue'

// Chromium only; not in lib.dom. https://developer.mozilla.org/docs/Web/API/BeforeInstallPromptEvent
interface BeforeInstallPromptEvent extends Event {
  prompt(): Promise<void>
  userChoice: Promise<{ outcome: 'accepted' | 'dismissed'; platform: string }>
}

export type InstallOutcome = 'accepted' | 'dismissed' | 'unavailable'

export interface InstallPrompt {
  /** True once the browser has offered installation (`beforeinstallprompt`) and until it is used or the app installed. */
  canInstall: ComputedRef<boolean>
  install(): Promise<InstallOutcome>
}

export const installPromptKey: InjectionKey<InstallPrompt> = Symbol('install-prompt')

/** Keeps the browser's install offer for our own button instead of its mini-infobar. */
export function createInstallPrompt(target: EventTarget): InstallPrompt {
  const offer = shallowRef<BeforeInstallPromptEvent | null>(null)

  target.addEventListener('beforeinstallprompt', (event) => {
    event.preventDefault()
    offer.value = event as BeforeInstallPromptEvent
  })
  target.addEventListener('appinstalled', () => {
    offer.value = null
  })

  async function install(): Promise<InstallOutcome> {
    const event = offer.value
    if (!event) return 'unavailable'
    // an offer can be prompted only once
    offer.value = null
    await event.prompt()
    return (await event.userChoice).outcome
  }

  return { canInstall: computed(() => offer.value !== null), install }
}

/** The app's install offer; never available outside the app. */
export function useInstallPrompt(): InstallPrompt {
  return inject(installPromptKey, () => createInstallPrompt(new EventTarget()), true)
}

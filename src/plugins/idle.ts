import { ref, type Ref } from 'vue'
import type { Router } from 'vue-router'

/**
 * Runs `task` once the first page has been painted and the browser has a moment to spare (at most `timeout` ms
 * later), so work the first screen does not show never delays it.
 * https://developer.mozilla.org/en-US/docs/Web/API/Window/requestIdleCallback
 */
export function whenIdle(task: () => void, timeout = 3000) {
  let started = false
  const idle = () => {
    if (started) return
    started = true
    if (typeof requestIdleCallback === 'function') requestIdleCallback(task, { timeout })
    else setTimeout(task, 1)
  }
  // the task after the next frame: the page of the first navigation is on screen by then; a tab opened in the
  // background draws no frames, so the timeout starts it there
  requestAnimationFrame(() => setTimeout(idle))
  setTimeout(idle, timeout)
}

let afterFirstPage: Ref<boolean> | undefined

/** Turns true once the router's first page is on screen and the browser is idle; one flag for the whole app. */
export function useAfterFirstPage(router: Router): Ref<boolean> {
  if (afterFirstPage) return afterFirstPage
  const flag = ref(false)
  const settle = () => whenIdle(() => (flag.value = true))
  void router.isReady().then(settle, settle)
  afterFirstPage = flag
  return flag
}

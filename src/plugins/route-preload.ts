import type { RouteLocationResolved, Router } from 'vue-router'

type Loader = () => Promise<unknown>

/** The route of the address the app opens at. */
export function openingRoute(router: Router, href = window.location.href): RouteLocationResolved {
  const url = new URL(href)
  return router.resolve(url.pathname + url.search)
}

/**
 * Starts loading the lazy view of the address the app opens at (its chunk, the chunks it imports and their
 * stylesheets, through Vite's preload helper) alongside the session check the router's guard waits for, instead of
 * after it.
 */
export function preloadOpeningRoute(router: Router, href = window.location.href) {
  for (const record of openingRoute(router, href).matched) {
    const view = record.components?.default
    // a lazy view is a bare function; a loaded component is an object
    if (typeof view === 'function' && !('__vccOpts' in view) && !('props' in view)) (view as Loader)().catch(() => undefined)
  }
}

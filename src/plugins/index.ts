import type { App } from 'vue'
import { createPinia } from 'pinia'
import router from '@/router'
import { useSessionStore } from '@/stores/session'
import vuetify from './vuetify'
import { installPwa } from './pwa'
import { loadIconFont } from './icon-font'
import { whenIdle } from './idle'
import { openingRoute, preloadOpeningRoute } from './route-preload'

export function registerPlugins(app: App) {
  // In a task of its own: inserting the view's preload links compiles the modules already fetched, tens of ms on a phone.
  setTimeout(() => preloadOpeningRoute(router))
  const pinia = createPinia()
  // The session check starts here, beside the view's chunks; the router's guard then waits for this same check, which
  // a public page (sign-in) on a browser without a session does not hold back.
  void useSessionStore(pinia).restore({ publicPage: openingRoute(router).meta.public === true })
  app.use(pinia).use(router).use(vuetify)
  installPwa(app, router)
  // 400 KB: on a slow network it would share the line with the first page's own requests
  const iconFont = () => whenIdle(() => loadIconFont())
  void router.isReady().then(iconFont, iconFont)
}

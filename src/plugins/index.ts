import type { App } from 'vue'
import { createPinia } from 'pinia'
import router from '@/router'
import vuetify from './vuetify'
import { installPwa } from './pwa'
import { loadIconFont } from './icon-font'
import { whenIdle } from './idle'
import { preloadOpeningRoute } from './route-preload'

export function registerPlugins(app: App) {
  preloadOpeningRoute(router)
  app.use(createPinia()).use(router).use(vuetify)
  installPwa(app, router)
  // 400 KB: on a slow network it would share the line with the first page's own requests
  const iconFont = () => whenIdle(() => loadIconFont())
  void router.isReady().then(iconFont, iconFont)
}

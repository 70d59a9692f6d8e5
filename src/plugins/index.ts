import type { App } from 'vue'
import { createPinia } from 'pinia'
import router from '@/router'
import vuetify from './vuetify'
import { installPwa } from './pwa'
import { loadIconFont } from './icon-font'

export function registerPlugins(app: App) {
  app.use(createPinia()).use(router).use(vuetify)
  installPwa(app, router)
  void router.isReady().then(
    () => loadIconFont(),
    () => loadIconFont(),
  )
}

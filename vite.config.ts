import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import vuetify from 'vite-plugin-vuetify'
import { VitePWA } from 'vite-plugin-pwa'

const apiTarget = `http://localhost:${process.env.PORT ?? 3000}`

export default defineConfig({
  plugins: [
    vue(),
    vuetify({ autoImport: true }),
    // https://vite-pwa-org.netlify.app/guide/
    VitePWA({
      strategies: 'generateSW',
      // A new version waits for the user's click: never reload under a half-filled exam.
      registerType: 'prompt',
      // Registered from src/plugins/pwa.ts once the router is ready.
      injectRegister: false,
      manifest: {
        id: '/',
        name: 'Plumbline — bedside JVP exam',
        short_name: 'Plumbline',
        description: 'Record the bedside jugular venous pressure exam, with or without a network.',
        lang: 'en',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        categories: ['medical'],
        theme_color: '#1F5C63',
        background_color: '#F4F1EC',
        icons: [
          { src: 'pwa-192x192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: 'pwa-512x512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: 'maskable-icon-512x512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      includeAssets: ['favicon.svg'],
      workbox: {
        // Every route chunk and stylesheet, and only the woff2 copies of Roboto and the icon font:
        // browsers that run this service worker all read woff2, so the eot/ttf/woff copies would be dead weight.
        globPatterns: ['**/*.{js,css,html,woff2}'],
        globIgnores: ['**/*.{eot,ttf,woff}'],
        // @mdi/font's CSS asks for `…woff2?v=7.4.47`; without ignoring `v` that request misses the precache offline.
        ignoreURLParametersMatching: [/^utm_/, /^fbclid$/, /^v$/],
        navigateFallback: 'index.html',
        navigateFallbackDenylist: [/^\/api(?:\/|$)/],
        // Nothing from /api is ever cached: answers carry patient data. There is no Background Sync route: the
        // outbox engine (src/stores/sync.ts) is the one retry path, with its backoff and the `online` event, and it
        // clears the outbox only on an acknowledged push; a second replay by the browser would only duplicate it.
        // Claiming clients on first install lets lazy route chunks come from the cache during the very first visit.
        clientsClaim: true,
        cleanupOutdatedCaches: true,
      },
    }),
  ],
  resolve: {
    alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) },
  },
  server: {
    proxy: { '/api': apiTarget },
  },
  build: {
    chunkSizeWarningLimit: 600,
    // dist/.vite/manifest.json maps entries to chunks for `npm run bench:bundle`
    manifest: true,
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'shared', environment: 'node', include: ['tests/shared/**/*.test.ts'] },
      },
      {
        extends: true,
        test: { name: 'server', environment: 'node', include: ['tests/server/**/*.test.ts'], testTimeout: 20_000 },
      },
      {
        extends: true,
        test: {
          name: 'client',
          environment: 'jsdom',
          include: ['tests/client/**/*.test.ts'],
          setupFiles: ['tests/setup.ts'],
          server: { deps: { inline: ['vuetify'] } },
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          testTimeout: 90_000,
          hookTimeout: 90_000,
          fileParallelism: false,
        },
      },
    ],
  },
})

import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath, pathToFileURL, URL } from 'node:url'
import type { Plugin, UserConfig } from 'vite'
import { defineConfig, type ViteUserConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import { postgresUnavailable } from './tests/server/postgres-bin.ts'
import vuetify from 'vite-plugin-vuetify'
import { VitePWA } from 'vite-plugin-pwa'
import { compression } from 'vite-plugin-compression2'
import { CAUTION_TEXT } from './shared/domain/interpretation.ts'

// The server-pg project needs PostgreSQL's programs (Debian: package postgresql) and, as root, an account to own its
// cluster; without them it is skipped, once, aloud, with the reason.
const postgresProblem = postgresUnavailable()
const postgresInstalled = postgresProblem === null
const warned = Symbol.for('plumbline.postgres-missing-warned')
if (!postgresInstalled && process.env.VITEST && !process.env.VITEST_POOL_ID && !(globalThis as Record<symbol, unknown>)[warned]) {
  ;(globalThis as Record<symbol, unknown>)[warned] = true
  console.warn(
    `server-pg: skipping the server tests on PostgreSQL: ${postgresProblem}`,
  )
}

const apiTarget = `http://localhost:${process.env.PORT ?? 3000}`

/** Files the server reads beside its own module (`new URL('./file', import.meta.url)`) go beside the bundle too. */
function besideTheBundle(): Plugin {
  return {
    name: 'plumbline:files-beside-the-bundle',
    enforce: 'pre',
    transform(code, id) {
      for (const [, relative] of code.matchAll(/new URL\(['"](\.\/[^'"]+)['"], import\.meta\.url\)/g)) {
        this.emitFile({ type: 'asset', fileName: path.basename(relative!), source: readFileSync(new URL(relative!, pathToFileURL(id))) })
      }
      return null
    },
  }
}

const ICON_NAME = /\bmdi-[a-z0-9]+(?:-[a-z0-9]+)*/g

/** Every `mdi-…` name written in the client and shared sources, and the ones Vuetify's own `$` aliases stand for. */
function iconNamesInUse(): Set<string> {
  const root = fileURLToPath(new URL('.', import.meta.url))
  const sources = ['src', 'shared'].flatMap((dir) =>
    readdirSync(path.join(root, dir), { recursive: true, encoding: 'utf8' })
      .filter((file) => /\.(vue|ts)$/.test(file))
      .map((file) => path.join(root, dir, file)),
  )
  sources.push(path.join(root, 'node_modules/vuetify/lib/iconsets/mdi.js'))
  return new Set(sources.flatMap((file) => readFileSync(file, 'utf8').match(ICON_NAME) ?? []))
}

/**
 * @mdi/font's stylesheet names all ~7,400 icons (54 KB gzip, render-blocking): the build keeps the rules of the icons
 * in use. Its @font-face goes in every mode: src/plugins/icon-font.ts loads the woff2 once the first page is up. An
 * icon name put together at run time (`'mdi-' + x`) is not seen: write names out in full.
 */
function iconSubset(): Plugin {
  let build = false
  return {
    name: 'plumbline:icon-subset',
    configResolved: (config) => void (build = config.command === 'build'),
    load(id) {
      if (!/@mdi\/font\/css\/materialdesignicons\.css$/.test(id)) return null
      const css = readFileSync(id, 'utf8').replace(/@font-face \{[^}]*\}/, '')
      if (!build) return css
      const inUse = iconNamesInUse()
      return css.replace(/\.(mdi-[a-z0-9-]+)::before \{\s*content: "\\[0-9A-F]+";\s*\}\s*/g, (rule, name: string) =>
        inUse.has(name) ? rule : '',
      )
    },
  }
}

/** Preloads the body text face (Roboto 400, Latin), so the first text does not wait for the stylesheet to name it. */
function preloadTextFont(): Plugin {
  return {
    name: 'plumbline:preload-text-font',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler(_html, { bundle }) {
        const font = Object.keys(bundle ?? {}).find((file) => /\/roboto-latin-400-normal-[\w-]+\.woff2$/.test(file))
        if (!font) throw new Error('Roboto 400 (Latin) is missing from the bundle: nothing to preload')
        const attrs = { rel: 'preload', as: 'font', type: 'font/woff2', href: `/${font}`, crossorigin: '' }
        return [{ tag: 'link', attrs, injectTo: 'head' }]
      },
    },
  }
}

/**
 * The standing caution, from the one place the app takes it, written into the page's boot screen: the page shows it
 * with the app bar while the scripts load, and the app replaces both when it mounts.
 */
function bootCaution(): Plugin {
  return {
    name: 'plumbline:boot-caution',
    transformIndexHtml: (html) => {
      const text = CAUTION_TEXT.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
      if (!html.includes('<!--boot-caution-->')) throw new Error('index.html has no <!--boot-caution--> mark')
      return html.replace('<!--boot-caution-->', text)
    },
  }
}

// `vite build --ssr`: the server and shared/ as one ES module for plain `node` (tsx stays a development tool). Packages
// stay imports, so `npm ci --omit=dev` provides them; `#shared/*` and the .ts extensions are resolved here.
const serverBuild: UserConfig = {
  publicDir: false,
  plugins: [besideTheBundle()],
  build: { outDir: 'dist/server', emptyOutDir: true, target: 'node20', sourcemap: true, ssrEmitAssets: true },
}

const app: ViteUserConfig = {
  plugins: [
    vue(),
    vuetify({ autoImport: true }),
    iconSubset(),
    preloadTextFont(),
    bootCaution(),
    // .br and .gz beside each text asset of 1 KB or more, for the server to send to browsers that accept them; a
    // smaller file gains less than a packet, and one the packing would not shrink gets no copy either.
    compression({ algorithms: ['brotliCompress', 'gzip'], include: /\.(html|css|js|mjs|json|svg|webmanifest|txt)$/, threshold: 1024 }),
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
        // Shown by browsers that offer a richer install dialog; the same pictures illustrate the README.
        screenshots: [
          { src: 'screenshots/quick-exam.png', sizes: '780x1688', type: 'image/png', form_factor: 'narrow', label: 'Quick exam at the bedside' },
          { src: 'screenshots/home.png', sizes: '780x1688', type: 'image/png', form_factor: 'narrow', label: 'Home: what waits for you' },
          { src: 'screenshots/exam-log.png', sizes: '780x1688', type: 'image/png', form_factor: 'narrow', label: 'Exam log on a phone' },
        ],
      },
      includeAssets: ['favicon.svg'],
      workbox: {
        // Every route chunk and stylesheet, and only the woff2 copies of Roboto and the icon font:
        // browsers that run this service worker all read woff2, so the eot/ttf/woff copies would be dead weight.
        globPatterns: ['**/*.{js,css,html,woff2}'],
        globIgnores: ['**/*.{eot,ttf,woff}', 'screenshots/**'],
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
  // Every component is written with <script setup> or setup(); without the options API, Vue's runtime is smaller.
  define: { __VUE_OPTIONS_API__: 'false' },
  resolve: {
    alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) },
  },
  server: {
    proxy: { '/api': apiTarget },
  },
  build: {
    outDir: 'dist/client',
    chunkSizeWarningLimit: 600,
    // One stylesheet (the styles of the components in use, 60 KB gzip) linked from the page, rather than one per chunk
    // that each page's script adds and waits for: each arrival restyled the page in a task of its own on a phone.
    // Measured with npm run bench:lighthouse (median of 3): sign-in 88 → 92, exam log 82 → 86.
    cssCodeSplit: false,
    // dist/client/.vite/manifest.json maps entries to chunks for `npm run bench:bundle`
    manifest: true,
    rolldownOptions: {
      output: {
        // zod and src/plugins/zod-jitless.ts in one chunk, in that order: the setting is made before any chunk that
        // builds a schema runs (in a chunk of its own, main.ts's first import would run after them).
        codeSplitting: { groups: [{ name: 'zod', test: /[\\/]node_modules[\\/]zod[\\/]|[\\/]src[\\/]plugins[\\/]zod-jitless\.ts$/ }] },
      },
    },
  },
  test: {
    // bcrypt at the production work factor costs ~0.7 s per hash in pure JS; config.ts allows less only under NODE_ENV=test.
    env: { BCRYPT_COST: '5' },
    // Browser tests mostly wait (for Chromium, the service worker, the sync engine's retries), so a third worker
    // keeps both cores busy; every project shares these workers.
    maxWorkers: 3,
    projects: [
      {
        extends: true,
        // Pure functions: nothing to isolate, so one worker runs every file.
        test: { name: 'shared', environment: 'node', include: ['tests/shared/**/*.test.ts'], isolate: false },
      },
      {
        extends: true,
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts'],
          globalSetup: ['tests/server/template-database.ts'],
          // A worker per file would import Express, Sequelize, sharp and our own modules again each time. Nothing a file
          // leaves behind reaches the next: the server keeps its caches per database (a WeakMap keyed by the Sequelize
          // instance) and every test opens a database of its own (DEVELOPERS.md, "Testing").
          isolate: false,
          setupFiles: ['tests/server/file-databases.ts'],
          testTimeout: 20_000,
        },
      },
      {
        extends: true,
        // The same files on PostgreSQL: a throwaway cluster (tests/server/postgres-cluster.ts) and a database per test
        // copied from one migrated template. Tests about SQLite itself are marked `describe.runIf(isSqlite)`.
        test: {
          name: 'server-pg',
          environment: 'node',
          include: postgresInstalled ? ['tests/server/**/*.test.ts'] : [],
          // The fuzz sample sends thousands of requests; it checks the routes' input handling, which the database does
          // not change, so it runs once, on SQLite.
          exclude: ['tests/server/fuzz/**'],
          env: { TEST_DATABASE: 'postgres' },
          globalSetup: ['tests/server/postgres-cluster.ts'],
          isolate: false,
          setupFiles: ['tests/server/file-databases.ts'],
          // Every query is a round trip to another process: a test of many writes takes longer than on SQLite.
          testTimeout: 30_000,
          // A file's first database is a copy of the template, and the demo seed's many writes are round trips.
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        // Dexie's package entry wraps its UMD build, which Node would load once per worker; its ES build is loaded
        // afresh for each file (see `inline` below), as it notes the global Blob class and IndexedDB when it loads.
        resolve: { alias: [{ find: /^dexie$/, replacement: 'dexie/dist/dexie.mjs' }] },
        test: {
          name: 'client',
          environment: 'jsdom',
          include: ['tests/client/**/*.test.ts'],
          setupFiles: ['tests/setup.ts'],
          globalSetup: ['tests/server/template-database.ts'],
          // One jsdom window per worker instead of per file; tests/setup.ts gives each file a clean slate.
          isolate: false,
          // Mounting a view loads its lazy pieces on first use; a shared, busy machine can take seconds for that.
          testTimeout: 15_000,
          server: { deps: { inline: ['vuetify', 'dexie'] } },
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          // Each file runs in its own worker with its own server, data folder and Chromium.
          globalSetup: ['tests/e2e/demo-template.ts'],
          testTimeout: 90_000,
          hookTimeout: 90_000,
          // expect.poll waits for the page, which on a busy machine takes more than the default second.
          expect: { poll: { timeout: 15_000 } },
        },
      },
    ],
  },
}

export default defineConfig(({ isSsrBuild }) => (isSsrBuild ? serverBuild : app))

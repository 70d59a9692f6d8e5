import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'
import vuetify from 'vite-plugin-vuetify'

const apiTarget = `http://localhost:${process.env.PORT ?? 3000}`

export default defineConfig({
  plugins: [vue(), vuetify({ autoImport: true })],
  resolve: {
    alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) },
  },
  server: {
    proxy: { '/api': apiTarget },
  },
  build: {
    chunkSizeWarningLimit: 600,
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

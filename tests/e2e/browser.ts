import { copyFileSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { chromium, type Browser, type Page } from 'playwright-core'
import { afterAll, beforeAll, inject } from 'vitest'
import { loadConfig } from '../../server/config.ts'
import { startServer, type RunningServer } from '../../server/index.ts'

export const DEMO_PASSWORD = 'bedside-demo'

/**
 * A temporary data folder holding a copy of the run's migrated and seeded database (tests/e2e/demo-template.ts), so a
 * server starting on it finds nothing left to migrate or seed; without the template, the server does both itself.
 */
export function demoDataDir(prefix = 'plumbline-e2e-'): string {
  const dataDir = mkdtempSync(path.join(tmpdir(), prefix))
  const template = inject('demoDatabase')
  if (template) copyFileSync(template, path.join(dataDir, 'plumbline.sqlite'))
  return dataDir
}

/** The real server (built client, SQLite file in a temporary folder, demo data) on a free port. */
export async function startDemoServer(): Promise<RunningServer & { dataDir: string }> {
  const dataDir = demoDataDir()
  const running = await startServer(loadConfig({ PORT: '0', DATA_DIR: dataDir, DEMO: 'true', LOG_LEVEL: 'silent' }))
  return {
    ...running,
    dataDir,
    close: async () => {
      await running.close()
      rmSync(dataDir, { recursive: true, force: true })
    },
  }
}

/**
 * Context options for a test that is not about the installable shell, offline use or sync: the service worker is
 * blocked, so the new context does not download and store the whole precache, about 0.7 s of CPU each (measured with
 * the sign-in file). The shell, offline and sync files, the quick exam's offline test and the first visit's policy
 * check keep the worker.
 */
export const NO_SERVICE_WORKER = { serviceWorkers: 'block' } as const

export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  })
}

export async function signInAs(page: Page, baseUrl: string, email: string) {
  await page.goto(`${baseUrl}/sign-in`)
  await page.getByTestId('sign-in-email').locator('input').fill(email)
  await page.getByTestId('sign-in-password').locator('input').fill(DEMO_PASSWORD)
  await page.getByTestId('sign-in-submit').click()
}

/** The demo server and a Chromium for one test file: started before its tests, closed after them. */
export function useDemoBrowser(): { readonly server: Awaited<ReturnType<typeof startDemoServer>>; readonly browser: Browser } {
  const demo = {} as { server: Awaited<ReturnType<typeof startDemoServer>>; browser: Browser }
  beforeAll(async () => {
    demo.server = await startDemoServer()
    demo.browser = await launchChromium()
  })
  afterAll(async () => {
    await demo.browser?.close()
    await demo.server?.close()
  })
  return demo
}

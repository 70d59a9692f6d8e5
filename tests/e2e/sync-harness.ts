import { rmSync } from 'node:fs'
import type { Page } from 'playwright-core'
import { expect } from 'vitest'
import { loadConfig } from '../../server/config.ts'
import { startServer, type RunningServer } from '../../server/index.ts'
import { demoDataDir } from './browser.ts'

// Sign-in hashes a password and the first visit loads lazy chunks: allow more than expect.poll's 1 s.
export const WAIT = { timeout: 15_000 }
// The engine retries on a capped backoff after failures; a restarted server is reached by the next attempt.
export const SYNC_WAIT = { timeout: 60_000, interval: 500 }

/** A server that can be stopped and started again on the same port and data folder, like a crashed and restarted one. */
export async function restartableServer() {
  const dataDir = demoDataDir('plumbline-e2e-sync-')
  // No grace period on stop: requests in flight are cut, as by a crash.
  const env = { DATA_DIR: dataDir, DEMO: 'true', LOG_LEVEL: 'silent', SHUTDOWN_GRACE_MS: '0' }
  const start = (port: number) => startServer(loadConfig({ ...env, PORT: String(port) }))
  let running: RunningServer | null = await start(0)
  const port = Number(new URL(running.url).port)
  return {
    url: running.url,
    stop: async () => {
      await running?.close()
      running = null
    },
    start: async () => void (running = await start(port)),
    dispose: async () => {
      await running?.close()
      rmSync(dataDir, { recursive: true, force: true })
    },
  }
}

const title = (page: Page) => page.getByTestId('step-title').textContent()

async function next(page: Page, expectedTitle: string) {
  await page.getByTestId('step-next').click()
  await expect.poll(() => title(page), WAIT).toBe(expectedTitle)
}

/** Records the worked example through the bedside flow, up to the review; answers the exam id. */
export async function recordUpToReview(page: Page, baseUrl: string, patientCode = 'SM-0142'): Promise<string> {
  await page.goto(`${baseUrl}/record`)
  await expect.poll(() => title(page), WAIT).toBe('Patient and position')
  await page.getByTestId('patient-code').locator('input').fill(patientCode)
  await page.getByTestId('inclination-input').locator('input').fill('45')
  await next(page, 'Pulsation')
  for (const sign of ['not-palpable', 'double-peaked', 'falls-on-inspiration']) await page.getByTestId(`sign-${sign}-present`).click()
  await next(page, 'Height')
  await page.getByTestId('column-top-seen').locator('input').check()
  await page.getByTestId('height-cm').locator('input').fill('4')
  await next(page, 'Waveform and manoeuvres')
  await next(page, 'Review')
  return new URL(page.url()).pathname.split('/').pop()!
}

/** How many rows a store of the app's IndexedDB holds, read without the app's code. */
export function countInDevice(page: Page, store: 'outbox' | 'exams') {
  return page.evaluate(
    (name) =>
      new Promise<number>((resolve, reject) => {
        const open = indexedDB.open('plumbline')
        open.onerror = () => reject(open.error)
        open.onsuccess = () => {
          const request = open.result.transaction(name).objectStore(name).count()
          request.onsuccess = () => resolve(request.result)
          request.onerror = () => reject(request.error)
          request.transaction!.oncomplete = () => open.result.close()
        }
      }),
    store,
  )
}

/** Whether a store of the app's IndexedDB holds the key, read without the app's code. */
export function isInDevice(page: Page, store: 'exams', key: string) {
  return page.evaluate(
    ([name, id]) =>
      new Promise<boolean>((resolve, reject) => {
        const open = indexedDB.open('plumbline')
        open.onerror = () => reject(open.error)
        open.onsuccess = () => {
          const request = open.result.transaction(name).objectStore(name).getKey(id)
          request.onsuccess = () => resolve(request.result !== undefined)
          request.onerror = () => reject(request.error)
          request.transaction!.oncomplete = () => open.result.close()
        }
      }),
    [store, key] as const,
  )
}

/** Queues changes in the app's outbox directly, as if they had been saved offline one by one. */
export function queueInDevice(page: Page, items: object[]) {
  return page.evaluate(
    (rows) =>
      new Promise<void>((resolve, reject) => {
        const open = indexedDB.open('plumbline')
        open.onerror = () => reject(open.error)
        open.onsuccess = () => {
          const transaction = open.result.transaction('outbox', 'readwrite')
          for (const row of rows) transaction.objectStore('outbox').add(row)
          transaction.oncomplete = () => (open.result.close(), resolve())
          transaction.onerror = () => reject(transaction.error)
        }
      }),
    items,
  )
}

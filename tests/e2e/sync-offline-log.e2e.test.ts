import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, signInAs } from './browser.ts'
import { countInDevice, recordUpToReview, restartableServer, SYNC_WAIT, WAIT } from './sync-harness.ts'

let browser: Browser

beforeAll(async () => {
  browser = await launchChromium()
})

afterAll(async () => {
  await browser?.close()
})

const visible = (page: Page, testId: string) => page.getByTestId(testId).isVisible()

describe('the exam log with no connection, in Chromium against the real server', () => {
  it('lists the device’s copies with when it last synced, marks an exam not yet sent, and reads the server again once back', async () => {
    const server = await restartableServer()
    try {
      const page = await (await browser.newContext({ viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true })).newPage()
      await signInAs(page, server.url, 'resident@saltmarsh.test')
      await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
      await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), WAIT).toBe(true)
      await page.getByTestId('sync-status').click()
      await expect.poll(() => page.getByTestId('sync-last').textContent(), SYNC_WAIT).toContain('Last synced')
      const pulled = await countInDevice(page, 'exams')
      await server.stop()

      await page.reload()
      const examId = await recordUpToReview(page, server.url, 'SM-0777')
      await page.getByTestId('save-exam').click()
      await expect.poll(() => page.getByTestId('save-notice').textContent(), WAIT).toContain('Saved on this device')
      await page.goto(`${server.url}/exams`)

      await expect.poll(() => page.getByTestId('log-from-device').textContent(), WAIT).toContain('Last synced with the server')
      await expect.poll(() => page.getByTestId('log-from-device').textContent(), WAIT).toContain('One exam is saved here but not yet sent')
      await expect.poll(() => page.getByTestId(`unsent-${examId}`).textContent(), WAIT).toContain('Not yet sent')
      expect(await page.getByTestId('exam-list').textContent()).toContain('SM-0777')
      // On a phone the filters fold behind one button; their files come from the precache, as the server is down.
      await page.getByTestId('exam-filters-toggle').click()
      await page.getByTestId('filter-status-draft').click()
      await expect.poll(() => page.getByTestId('exam-list').textContent(), WAIT).toContain('SM-0777')
      expect(pulled).toBeGreaterThan(0)

      await server.start()
      await page.evaluate(() => window.dispatchEvent(new Event('online')))

      await expect.poll(() => countInDevice(page, 'outbox'), SYNC_WAIT).toBe(0)
      await expect.poll(() => visible(page, 'log-from-device'), SYNC_WAIT).toBe(false)
      await expect.poll(() => page.getByTestId(`unsent-${examId}`).count(), WAIT).toBe(0)
      await expect.poll(() => page.getByTestId('exam-list').textContent(), WAIT).toContain('SM-0777')
      await page.context().close()
    } finally {
      await server.dispose()
    }
  })
})

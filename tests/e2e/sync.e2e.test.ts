import { randomUUID } from 'node:crypto'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { AuditEventModel, ExamModel } from '../../server/models/index.ts'
import { launchChromium, signInAs, startDemoServer } from './browser.ts'
import { countInDevice, isInDevice, queueInDevice, recordUpToReview, restartableServer, SYNC_WAIT, WAIT } from './sync-harness.ts'

let browser: Browser

beforeAll(async () => {
  browser = await launchChromium()
})

afterAll(async () => {
  await browser?.close()
})

async function phonePage() {
  const context = await browser.newContext({ viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true })
  return context.newPage()
}

async function signedIn(page: Page, url: string, email = 'resident@saltmarsh.test') {
  await signInAs(page, url, email)
  await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
}

const rowsOnServer = (ids: string[]) => ExamModel.count({ where: { id: ids } })
const creations = (ids: string[]) => AuditEventModel.count({ where: { entityId: ids, action: 'exam-create' } })

describe('sync in Chromium against the real server', () => {
  it('an exam recorded while the server is unreachable, even across a reload, reaches it exactly once when it is back', async () => {
    const server = await restartableServer()
    try {
      const page = await phonePage()
      await signedIn(page, server.url)
      await page.evaluate(() => navigator.serviceWorker.ready)
      await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), WAIT).toBe(true)
      await server.stop()

      await page.reload()
      const examId = await recordUpToReview(page, server.url)
      await page.getByTestId('save-exam').click()

      await expect.poll(() => page.getByTestId('save-notice').textContent(), WAIT).toContain('Saved on this device')
      expect(await page.getByTestId('sync-unsynced-count').textContent()).toBe('1')
      expect(await countInDevice(page, 'outbox')).toBe(1)

      await server.start()

      await expect.poll(() => countInDevice(page, 'outbox'), SYNC_WAIT).toBe(0)
      expect(await rowsOnServer([examId])).toBe(1)
      expect(await creations([examId])).toBe(1)
      await expect.poll(() => page.getByTestId('sync-unsynced-count').count(), WAIT).toBe(0)
      await page.context().close()
    } finally {
      await server.dispose()
    }
  })

  it('when another device changed the same exam first, the second sees both versions on the conflict screen', async () => {
    const server = await startDemoServer()
    try {
      const first = await phonePage()
      await signedIn(first, server.url)
      const examId = await recordUpToReview(first, server.url)
      await first.getByTestId('save-exam').click()
      await expect.poll(() => new URL(first.url()).pathname, WAIT).toBe(`/exams/${examId}`)
      const second = await phonePage()
      await signedIn(second, server.url)
      await expect.poll(() => isInDevice(second, 'exams', examId), WAIT).toBe(true)
      await second.goto(`${server.url}/record/${examId}`)
      await expect.poll(() => second.getByTestId('step-title').textContent(), WAIT).toBe('Review')

      await first.goto(`${server.url}/record/${examId}`)
      await first.getByTestId('step-back').click()
      await first.getByTestId('step-back').click()
      await first.getByTestId('height-cm').locator('input').fill('6')
      await first.getByTestId('step-next').click()
      await first.getByTestId('step-next').click()
      await first.getByTestId('save-exam').click()
      await expect.poll(() => new URL(first.url()).pathname, WAIT).toBe(`/exams/${examId}`)
      await second.getByTestId('offset-model').getByText('Fixed 5 cm').click()
      await second.getByTestId('save-exam').click()

      await expect.poll(() => new URL(second.url()).pathname, WAIT).toBe('/sync/conflicts')
      const card = second.getByTestId(`conflict-${examId}`)
      await expect.poll(() => card.getByTestId('diff-heightCm').textContent(), WAIT).toContain('Height above the sternal angle')
      expect(await card.getByTestId('diff-heightCm').locator('td').allTextContents()).toEqual(['4', '6'])
      expect(await card.getByTestId('diff-offsetModel').locator('td').allTextContents()).toEqual(['fixed-5cm', 'incline-adjusted'])

      await card.getByTestId('take-server').click()

      await expect.poll(() => second.getByTestId('sync-nothing-to-resolve').isVisible(), WAIT).toBe(true)
      expect(await countInDevice(second, 'outbox')).toBe(0)
      expect((await ExamModel.findByPk(examId))!).toMatchObject({ heightCm: 6, offsetModel: 'incline-adjusted', version: 2 })
      await first.context().close()
      await second.context().close()
    } finally {
      await server.close()
    }
  })

  it('a push of many exams cut off by the server stopping arrives exactly once after it restarts', async () => {
    const server = await restartableServer()
    try {
      const page = await phonePage()
      await signedIn(page, server.url)
      const me = await page.evaluate(async () => (await (await fetch('/api/auth/refresh', { method: 'POST' })).json()).user)
      const ids = Array.from({ length: 600 }, () => randomUUID())
      const examinedAt = new Date(Date.now() - 60 * 60 * 1000).toISOString()
      const payload = { teamId: me.teams[0].id, examinedAt, inclinationDeg: 45, vein: 'right-internal', columnTop: 'seen', heightMethod: 'vertical', heightCm: 4, notes: '' }
      const items = ids.map((id, i) => ({
        examId: id, authorId: me.id, payload: { ...payload, id, patientCode: `SM-${String(i).padStart(4, '0')}` },
        baseVersion: null, state: 'pending', attempts: 0, lastError: null, serverCopy: null, queuedAt: examinedAt,
      }))
      await queueInDevice(page, items)
      const firstAnswer = page.waitForResponse((response) => response.url().includes('/api/sync/push'))

      await page.evaluate(() => window.dispatchEvent(new Event('online')))
      await firstAnswer
      await server.stop()
      const leftWhileDown = await countInDevice(page, 'outbox')
      await server.start()

      expect(leftWhileDown).toBeGreaterThan(0)
      await expect.poll(() => countInDevice(page, 'outbox'), SYNC_WAIT).toBe(0)
      expect(await rowsOnServer(ids)).toBe(600)
      expect(await creations(ids)).toBe(600)
      await page.context().close()
    } finally {
      await server.dispose()
    }
  })
})

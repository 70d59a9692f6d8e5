import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchChromium, signInAs, startDemoServer } from './browser.ts'

const EDUCATOR = 'educator@saltmarsh.test'
// Sign-in hashes a password and the first visit loads lazy chunks on a busy machine: allow generous waits.
const WAIT = { timeout: 15_000 }

let server: Awaited<ReturnType<typeof startDemoServer>>
let browser: Browser

beforeAll(async () => {
  server = await startDemoServer()
  browser = await launchChromium()
})

afterAll(async () => {
  await browser?.close()
  await server?.close()
})

describe('calibration rounds in Chromium', () => {
  it('the educator opens the demo’s closed round and reads the ICC, the bias table and the missing entry, on a phone-width screen', async () => {
    const context = await browser.newContext({ viewport: { width: 360, height: 780 } })
    const page = await context.newPage()
    await signInAs(page, server.url, EDUCATOR)
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')

    await page.goto(`${server.url}/rounds`)
    const item = page.locator('[data-testid^="round-item-"]', { hasText: 'Ward 7 North calibration' })
    await expect.poll(() => item.isVisible(), WAIT).toBe(true)
    expect(await item.textContent()).toContain('23 of 24 entries')
    await item.click()

    await expect.poll(() => page.getByTestId('round-icc-value').isVisible(), WAIT).toBe(true)
    expect(await page.getByTestId('round-icc-value').textContent()).toMatch(/^\s*−?\d\.\d\d\s*$/)
    expect(await page.getByTestId('round-icc').textContent()).toMatch(/95% CI −?\d\.\d\d to \d\.\d\d/)
    expect(await page.getByTestId('round-kappa-label').textContent()).toMatch(/(slight|fair|moderate|substantial|almost perfect|poor) agreement/)
    const rows = page.getByTestId('round-bias-row')
    await expect.poll(() => rows.count(), WAIT).toBe(4)
    expect(await page.getByTestId('round-bias-table').textContent()).toContain('Dr Tomas Lindqvist')
    expect(await page.getByTestId('round-missing-list').textContent()).toContain('SM-0316 — Dr Aiko Brennan')
    expect(await page.getByTestId('exam-caution').isVisible()).toBe(true)
    expect(await page.getByTestId('round-status').textContent()).toContain('Closed')
    await context.close()
  })
})

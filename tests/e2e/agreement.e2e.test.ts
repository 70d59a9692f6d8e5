import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { NO_SERVICE_WORKER, signInAs, useDemoBrowser } from './browser.ts'

const EDUCATOR = 'educator@saltmarsh.test'
const CAUTION_START = 'Estimate from physical examination, with a wide error band.'

// Sign-in hashes a password and the dashboard's lazy chunk holds chart.js: allow a busy machine time.
const WAIT = { timeout: 15_000 }

const demo = useDemoBrowser()

async function openDashboard(width: number, height: number): Promise<Page> {
  const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width, height } })
  const page = await context.newPage()
  await signInAs(page, demo.server.url, EDUCATOR)
  await expect.poll(() => new URL(page.url()).pathname, WAIT).not.toBe('/sign-in')
  await page.goto(`${demo.server.url}/agreement`)
  await expect.poll(() => page.getByTestId('bland-altman-caption').isVisible(), WAIT).toBe(true)
  return page
}

/** How many pixels of the canvas something was drawn on (not fully transparent). */
function drawnPixels(page: Page, selector: string) {
  return page.locator(selector).evaluate((canvas: HTMLCanvasElement) => {
    const { data } = canvas.getContext('2d')!.getImageData(0, 0, canvas.width, canvas.height)
    let drawn = 0
    for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) drawn += 1
    return drawn
  })
}

describe('the agreement dashboard in Chromium', () => {
  it('the demo educator opens it from the menu and sees the Bland–Altman plot and the residents under-reading', async () => {
    const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 1280, height: 900 } })
    const page = await context.newPage()
    await signInAs(page, demo.server.url, EDUCATOR)

    await expect.poll(() => page.getByTestId('nav-agreement').isVisible(), WAIT).toBe(true)
    await page.getByTestId('nav-agreement').click()

    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/agreement')
    await expect.poll(() => page.getByTestId('agreement-caution').textContent(), WAIT).toContain(CAUTION_START)
    // The demo seeds 150 resident–attending pairs (server/demo/demo-pairs.ts).
    await expect.poll(async () => Number(await page.getByTestId('agreement-n').textContent()), WAIT).toBeGreaterThanOrEqual(120)
    await expect.poll(() => drawnPixels(page, '[data-testid="bland-altman"] canvas'), WAIT).toBeGreaterThan(2_000)
    expect(await page.getByTestId('bland-altman-caption').textContent()).toMatch(/Bias −\d\.\d cm/)
    const biases = await page.getByTestId('resident-bias-value').allTextContents()
    expect(biases.length).toBeGreaterThanOrEqual(6)
    expect(biases.filter((b) => b.startsWith('−')).length).toBeGreaterThanOrEqual(1)
    expect(await page.getByTestId('agreement-bias').textContent()).toMatch(/^−\d\.\d cm/)
    await context.close()
  })

  it('at 360 px wide the dashboard fits the screen and still draws the plot', async () => {
    const page = await openDashboard(360, 740)

    await expect.poll(() => drawnPixels(page, '[data-testid="bland-altman"] canvas'), WAIT).toBeGreaterThan(1_000)
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await page.context().close()
  })
})

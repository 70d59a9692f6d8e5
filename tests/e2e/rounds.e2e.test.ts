import { describe, expect, it } from 'vitest'
import { NO_SERVICE_WORKER, signInAs, useDemoBrowser } from './browser.ts'

const EDUCATOR = 'educator@saltmarsh.test'
// Sign-in hashes a password and the first visit loads lazy chunks on a busy machine: allow generous waits.
const WAIT = { timeout: 15_000 }

const demo = useDemoBrowser()

describe('calibration rounds in Chromium', () => {
  it('the educator opens the demo’s closed round and reads the ICC, the bias table and the missing entry, on a phone-width screen', async () => {
    const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 360, height: 780 } })
    const page = await context.newPage()
    await signInAs(page, demo.server.url, EDUCATOR)
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')

    await page.goto(`${demo.server.url}/rounds`)
    const item = page.locator('[data-testid^="round-item-"]', { hasText: 'Ward 7 North calibration' })
    await expect.poll(() => item.isVisible(), WAIT).toBe(true)
    await expect.poll(() => item.textContent(), WAIT).toContain('23 of 24 entries')
    await item.click()

    await expect.poll(() => page.getByTestId('round-icc-value').isVisible(), WAIT).toBe(true)
    expect(await page.getByTestId('round-icc-value').textContent()).toMatch(/^\s*−?\d\.\d\d\s*$/)
    expect(await page.getByTestId('round-icc').textContent()).toMatch(/95% CI −?\d\.\d\d to \d\.\d\d/)
    expect(await page.getByTestId('round-kappa-label').textContent()).toMatch(/(slight|fair|moderate|substantial|almost perfect|poor) agreement/)
    const rows = page.getByTestId('round-bias-row')
    await expect.poll(() => rows.count(), WAIT).toBe(4)
    expect(await page.getByTestId('round-bias-table').textContent()).toContain('Dr Tomas Lindqvist')
    // The educator is not one of the round's examiners: the missing entry's code arrives as its keyed pseudonym.
    const missing = page.getByTestId('round-missing-list')
    await expect.poll(() => missing.textContent(), WAIT).toMatch(/P-[0-9a-f]{8} — Dr Aiko Brennan/)
    expect(await missing.textContent()).not.toContain('SM-0316')
    expect(await page.getByTestId('round-grid').textContent()).not.toMatch(/SM-\d{4}/)
    await expect.poll(() => page.getByTestId('round-codes-masked-note').isVisible(), WAIT).toBe(true)
    await expect.poll(() => page.getByTestId('exam-caution').isVisible(), WAIT).toBe(true)
    await expect.poll(() => page.getByTestId('round-status').textContent(), WAIT).toContain('Closed')
    await context.close()
  })
})

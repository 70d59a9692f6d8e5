import { describe, expect, it } from 'vitest'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import { NO_SERVICE_WORKER, useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()
const WAIT = { timeout: 15_000 }

describe('the first visit in Chromium (built client, production server)', () => {
  it('the sign-in page breaks no rule of the Content-Security-Policy (no eval probe, no inline script)', async () => {
    const page = await demo.browser.newPage(NO_SERVICE_WORKER)
    await page.addInitScript(() => {
      const seen: string[] = []
      Object.assign(window, { violations: seen })
      document.addEventListener('securitypolicyviolation', (e) => seen.push(`${e.violatedDirective} ${e.blockedURI} ${e.sourceFile}`))
    })

    await page.goto(`${demo.server.url}/sign-in`)
    await expect.poll(() => page.getByTestId('sign-in-email').isVisible(), WAIT).toBe(true)

    expect(await page.evaluate(() => (window as unknown as { violations: string[] }).violations)).toEqual([])
    await page.close()
  })

  it('paints the app bar and the standing caution from the page itself, before any script, and the app then replaces them', async () => {
    const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, javaScriptEnabled: false })
    const bare = await context.newPage()
    await bare.goto(`${demo.server.url}/exams`)

    expect(await bare.locator('.boot-bar').textContent()).toBe('Plumbline')
    expect((await bare.getByRole('note').textContent())?.trim()).toBe(CAUTION_TEXT)
    expect(await bare.getByRole('note').isVisible()).toBe(true)
    await context.close()

    const page = await demo.browser.newPage(NO_SERVICE_WORKER)
    await page.goto(`${demo.server.url}/sign-in`)
    await expect.poll(() => page.getByTestId('sign-in-email').isVisible(), WAIT).toBe(true)
    expect(await page.locator('.boot-bar, .boot-caution').count()).toBe(0)
    await page.close()
  })

  it('shows the heading in Roboto and then loads the icon font, so the icons draw', async () => {
    const page = await demo.browser.newPage(NO_SERVICE_WORKER)

    await page.goto(`${demo.server.url}/sign-in`)
    await expect.poll(() => page.getByRole('heading', { name: 'Sign in to Plumbline' }).isVisible(), WAIT).toBe(true)

    const loaded = (family: string) =>
      page.evaluate(
        (name) => [...document.fonts].some((face) => face.family.replace(/"/g, '') === name && face.status === 'loaded'),
        family,
      )
    await expect.poll(() => loaded('Material Design Icons'), WAIT).toBe(true)
    expect(await loaded('Roboto')).toBe(true)
    await page.close()
  })
})

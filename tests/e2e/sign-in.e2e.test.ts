import { describe, expect, it } from 'vitest'
import { NO_SERVICE_WORKER, signInAs, useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()
// Sign-in verifies a bcrypt hash of production cost: on a loaded machine that takes longer than expect.poll's default second.
const WAIT = { timeout: 10_000 }

async function freshPage() {
  const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 1280, height: 800 } })
  return context.newPage()
}

describe('signing in with the demo accounts in Chromium', () => {
  it('the resident sees the demo ribbon and the resident navigation, then signs out', async () => {
    const page = await freshPage()

    await signInAs(page, demo.server.url, 'resident@saltmarsh.test')

    await expect.poll(() => page.getByTestId('nav-teams').isVisible(), WAIT).toBe(true)
    await expect.poll(() => page.getByTestId('demo-ribbon').isVisible(), WAIT).toBe(true)
    await expect.poll(() => page.getByRole('heading', { name: /Dr Sam Whitcombe/ }).isVisible(), WAIT).toBe(true)
    expect(await page.getByTestId('nav-accounts').count()).toBe(0)

    await page.getByTestId('user-menu').click()
    await page.getByTestId('sign-out').click()

    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/sign-in')
    await page.goto(`${demo.server.url}/teams`)
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/sign-in')
    await page.context().close()
  })

  it.each([
    ['admin@saltmarsh.test', ['home', 'accounts'], ['teams']],
    ['educator@saltmarsh.test', ['home', 'teams'], ['accounts']],
    ['attending@saltmarsh.test', ['home', 'teams'], ['accounts']],
    ['attending2@saltmarsh.test', ['home', 'teams'], ['accounts']],
    ['resident2@saltmarsh.test', ['home', 'teams'], ['accounts']],
  ])('%s sees only its role navigation', async (email, shown, hidden) => {
    const page = await freshPage()

    await signInAs(page, demo.server.url, email)

    await expect.poll(() => page.getByTestId(`nav-${shown[1]}`).isVisible(), WAIT).toBe(true)
    for (const name of shown) expect(await page.getByTestId(`nav-${name}`).isVisible()).toBe(true)
    for (const name of hidden) expect(await page.getByTestId(`nav-${name}`).count()).toBe(0)
    await page.context().close()
  })

  it('a wrong password shows a message and keeps the typed e-mail', async () => {
    const page = await freshPage()
    await page.goto(`${demo.server.url}/sign-in`)
    await page.getByTestId('sign-in-email').locator('input').fill('resident@saltmarsh.test')
    await page.getByTestId('sign-in-password').locator('input').fill('wrong-password')

    await page.getByTestId('sign-in-submit').click()

    await expect.poll(() => page.getByTestId('sign-in-alert').isVisible(), WAIT).toBe(true)
    expect(await page.getByTestId('sign-in-email').locator('input').inputValue()).toBe('resident@saltmarsh.test')
    await page.context().close()
  })
})

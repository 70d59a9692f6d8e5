import type { Browser } from 'playwright-core'
import type { ExpectStatic } from 'vitest'
import { WAIT, audit, type Tab } from './axe-audit.ts'
import { NO_SERVICE_WORKER, signInAs } from './browser.ts'

export const VIEWPORTS = { phone: { width: 390, height: 844 }, desktop: { width: 1280, height: 800 } } as const
export const THEMES = ['plumblineLight', 'plumblineDark'] as const

/** One size and one theme in which every screen is checked. */
export interface Look {
  size: keyof typeof VIEWPORTS
  theme: (typeof THEMES)[number]
}

export const LOOKS: Look[] = (Object.keys(VIEWPORTS) as Look['size'][]).flatMap((size) => THEMES.map((theme) => ({ size, theme })))

/** A screen to check: `open` brings it up (navigating, filling what it needs); `ready` is shown once its data is in. */
export interface Screen {
  name: string
  open: (tab: Tab) => Promise<void>
  ready: string
}

/** Navigates inside the running app (no reload: the session, the theme and the injected scripts stay). */
export async function go({ page, expect }: Tab, path: string): Promise<void> {
  await expect.poll(() => page.evaluate(() => '__vue_app__' in (document.querySelector('#app') ?? {})), WAIT).toBe(true)
  await page.evaluate(async (to) => {
    const app = (
      document.querySelector('#app') as unknown as {
        __vue_app__: { config: { globalProperties: { $router: { push(to: string): Promise<unknown> } } } }
      }
    ).__vue_app__
    await app.config.globalProperties.$router.push(to)
  }, path)
}

/** A page of its own context, signed in as `account` (once: later loads restore the session) or on the sign-in page. */
export async function tabFor(expect: ExpectStatic, browser: Browser, baseUrl: string, account?: string): Promise<Tab> {
  // axe is injected as a script of the test, which the app's Content-Security-Policy would rightly refuse.
  const page = await (await browser.newContext({ ...NO_SERVICE_WORKER, bypassCSP: true })).newPage()
  if (!account) {
    await page.goto(`${baseUrl}/sign-in`)
    return { page, expect }
  }
  await signInAs(page, baseUrl, account)
  await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
  return { page, expect }
}

/** Every screen in every look; per look the theme is stored and the app loaded afresh, so it starts in that theme. */
export async function auditScreens(tab: Tab, screens: Screen[], looks = LOOKS): Promise<string[]> {
  const { page } = tab
  const findings: string[] = []
  for (const { size, theme } of looks) {
    await page.setViewportSize(VIEWPORTS[size])
    await page.evaluate((name) => localStorage.setItem('plumbline.theme', name), theme)
    // A fresh load of the start page (the sign-in page when signed out), so no screen is left half-way.
    await page.goto(new URL('/', page.url()).href)
    await tab.expect.poll(() => page.locator(`.v-application.v-theme--${theme}`).count(), WAIT).toBe(1)
    for (const screen of screens) {
      await screen.open(tab)
      findings.push(...(await audit(tab, screen.ready)).map((f) => `${size}, ${theme}, ${screen.name}: ${f}`))
    }
  }
  return findings
}

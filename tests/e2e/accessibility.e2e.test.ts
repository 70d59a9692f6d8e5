import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { signInAs, useDemoBrowser } from './browser.ts'

const demo = useDemoBrowser()
const WAIT = { timeout: 15_000 }
const AXE_SCRIPT = createRequire(import.meta.url).resolve('axe-core/axe.min.js')

const VIEWPORTS = { phone: { width: 390, height: 844 }, desktop: { width: 1280, height: 800 } } as const
const THEMES = ['plumblineLight', 'plumblineDark'] as const

/** The screens each role works in, by the account that reaches them. */
const SCREENS: { account: string; paths: string[] }[] = [
  { account: 'resident@saltmarsh.test', paths: ['/', '/exams', '/record'] },
  { account: 'attending@saltmarsh.test', paths: ['/signoff', '/agreement', '/rounds'] },
  { account: 'admin@saltmarsh.test', paths: ['/admin/accounts', '/admin/settings'] },
]

interface Violation {
  id: string
  impact: string | null
  help: string
  nodes: { target: string[] }[]
}

/** axe-core's serious and critical findings on the page as it stands (Deque's WCAG 2 A/AA rules and best practices). */
async function seriousFindings(page: Page): Promise<string[]> {
  await page.addScriptTag({ path: AXE_SCRIPT })
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (c: Document, o: object) => Promise<{ violations: Violation[] }> } }).axe
    return (await axe.run(document, { resultTypes: ['violations'] })).violations
  })
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)
}

async function settled(page: Page, path: string): Promise<void> {
  await page.goto(`${demo.server.url}${path}`)
  await expect.poll(() => page.locator('h1').count(), WAIT).toBeGreaterThan(0)
  await page.waitForLoadState('networkidle')
}

/** Every screen at one size and theme, each account in its own browser context. */
async function findingsAt(size: keyof typeof VIEWPORTS, theme: (typeof THEMES)[number]): Promise<string[]> {
  const findings: string[] = []
  for (const { account, paths } of [{ account: '', paths: ['/sign-in'] }, ...SCREENS]) {
    // axe is injected as a script of the test, which the app's Content-Security-Policy would rightly refuse.
    const context = await demo.browser.newContext({ viewport: VIEWPORTS[size], bypassCSP: true })
    await context.addInitScript((name) => localStorage.setItem('plumbline.theme', name), theme)
    const page = await context.newPage()
    if (account) {
      await signInAs(page, demo.server.url, account)
      await expect.poll(() => page.url(), WAIT).not.toContain('/sign-in')
    }
    for (const path of paths) {
      await settled(page, path)
      findings.push(...(await seriousFindings(page)).map((f) => `${size}, ${theme}, ${path}: ${f}`))
    }
    await context.close()
  }
  return findings
}

describe('accessibility of the main screens (axe-core in Chromium)', () => {
  it('on a phone and a desktop, in the light and the dark theme, no screen has a serious or critical violation', async () => {
    const sizes = Object.keys(VIEWPORTS) as (keyof typeof VIEWPORTS)[]
    // The four combinations side by side: most of each run is waiting for pages to settle.
    const findings = await Promise.all(sizes.flatMap((size) => THEMES.map((theme) => findingsAt(size, theme))))

    expect(findings.flat()).toEqual([])
  }, 240_000)
})

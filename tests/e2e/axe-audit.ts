import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'
import type { ExpectStatic } from 'vitest'

export const WAIT = { timeout: 15_000 }
const AXE_SCRIPT = createRequire(import.meta.url).resolve('axe-core/axe.min.js')
// Colours are read at their final value, never half-way through a fade or a ripple.
const STILL = '*,*::before,*::after{transition:none!important;animation:none!important}'

/**
 * A page and the `expect` of the test driving it: tests of one file run side by side, so each waits with its own.
 * https://vitest.dev/guide/test-context#expect
 */
export interface Tab {
  page: Page
  expect: ExpectStatic
}

/** What still shows the page loading, or '' once it has settled. */
function unsettled(page: Page, ready: string): Promise<string> {
  return page.evaluate((readySelector) => {
    const shown = (el: Element) => el.getBoundingClientRect().height > 0 && getComputedStyle(el).visibility !== 'hidden'
    const anyShown = (selector: string) => [...document.querySelectorAll(selector)].some(shown)
    if (anyShown('[role=progressbar]:not([aria-valuenow])')) return 'an indeterminate loading bar or spinner'
    if (anyShown('.v-skeleton-loader')) return 'a skeleton loader'
    if (anyShown('.v-data-table-rows-loading')) return 'a table loading its rows'
    if (document.fonts.status !== 'loaded') return 'fonts loading'
    if (!document.querySelector('h1')) return 'no h1'
    return anyShown(readySelector) ? '' : `nothing matching ${readySelector}`
  }, ready)
}

interface Violation {
  id: string
  impact?: string | null
  help: string
  nodes: { target: unknown[] }[]
}

// Deque's WCAG 2 A/AA rules and best practices, plus "label-content-name-mismatch" (off by default as experimental):
// a control's accessible name must contain its visible text (WCAG 2.1 SC 2.5.3 Label in Name).
function runAxe(): Promise<Violation[]> {
  const axe = (window as unknown as { axe: { run: (c: Document, o: object) => Promise<{ violations: Violation[] }> } }).axe
  return axe
    .run(document, { resultTypes: ['violations'], rules: { 'label-content-name-mismatch': { enabled: true } } })
    .then((r) => r.violations)
}

/** Waits for the screen to settle, then lists its serious and critical axe findings and any h1 count but one. */
export async function audit({ page, expect }: Tab, ready: string): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) {
    await page.addStyleTag({ content: STILL })
    await page.addScriptTag({ path: AXE_SCRIPT })
  }
  await expect.poll(() => unsettled(page, ready), WAIT).toBe('')
  const violations = await page.evaluate(runAxe)
  const findings = violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)
  const headings = await page.locator('h1').count()
  return headings === 1 ? findings : [...findings, `${headings} h1 elements, not one`]
}

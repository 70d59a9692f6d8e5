import { randomUUID } from 'node:crypto'
import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, launchChromium, NO_SERVICE_WORKER, signInAs, startDemoServer } from './browser.ts'
import { WORKED_EXAMPLE_FINDINGS } from '../../tests/shared/worked-example.ts'

const RESIDENT = 'resident@saltmarsh.test'
// Sign-in hashes a password and the first visit loads lazy chunks: allow more than expect.poll's 1 s.
const WAIT = { timeout: 10_000 }

let server: Awaited<ReturnType<typeof startDemoServer>>
let browser: Browser
let examId: string
/** The band the server stored, as the log prints it: with the demo's pairs the error term is local, not the default. */
let band: string
const patientCode = `SM-LOG-${randomUUID().slice(0, 6).toUpperCase()}`

async function apiAs(email: string) {
  const login = await fetch(`${server.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  const { token, user } = (await login.json()) as { token: string; user: { teams: { id: string }[] } }
  return { headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, teamId: user.teams[0]!.id }
}

/** The worked example (h = 4 cm at 45°, ruler, incline-adjusted), created through the real API. */
async function createWorkedExample() {
  const { headers, teamId } = await apiAs(RESIDENT)
  const body = {
    id: randomUUID(),
    patientCode,
    teamId,
    examinedAt: new Date().toISOString(),
    ...WORKED_EXAMPLE_FINDINGS,
  }
  const response = await fetch(`${server.url}/api/exams`, { method: 'POST', headers, body: JSON.stringify(body) })
  expect(response.status).toBe(201)
  const { estimate } = (await response.json()) as { estimate: { bandCmH2O: [number, number]; observerSource: string } }
  expect(estimate.observerSource).toMatch(/^local-/)
  return { id: body.id, band: estimate.bandCmH2O.map((v) => v.toFixed(1)).join('–') }
}

async function signedInPage(context: BrowserContext) {
  const page = await context.newPage()
  await signInAs(page, server.url, RESIDENT)
  // home once signed in (below the lg breakpoint the navigation drawer is built only when first opened)
  await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
  return page
}

beforeAll(async () => {
  server = await startDemoServer()
  browser = await launchChromium()
  const created = await createWorkedExample()
  examId = created.id
  band = created.band
})

afterAll(async () => {
  await browser?.close()
  await server?.close()
})

describe('the exam log in Chromium', () => {
  it('the resident finds the worked example in the log, opens it and copies the note', async () => {
    const context = await browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 1280, height: 800 } })
    await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: server.url })
    const page = await signedInPage(context)

    await page.getByTestId('nav-exams').click()
    await page.getByTestId('filter-patient').locator('input').fill(patientCode)
    await page.getByTestId('filter-patient').locator('input').press('Enter')
    const row = page.getByTestId('exam-table').locator('tbody tr', { hasText: patientCode })
    await expect.poll(() => row.isVisible(), WAIT).toBe(true)
    expect(await row.textContent()).toContain(band)
    await row.click()

    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/exams/${examId}`)
    await expect.poll(() => page.getByTestId('exam-estimate-cmh2o').textContent(), WAIT).toContain('13.7')
    await page.getByTestId('exam-copy-note').click()
    await expect.poll(() => page.getByTestId('exam-snackbar').textContent(), WAIT).toContain('Note copied')
    const note = await page.evaluate(() => navigator.clipboard.readText())
    expect(note).toContain('13.7 cmH₂O')
    expect(note).toContain(`patient ${patientCode}`)
    await context.close()
  })

  it('the patient code in the table is a link in the theme primary, not the browser blue', async () => {
    const context = await browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 1280, height: 800 } })
    const page = await signedInPage(context)

    await page.goto(`${server.url}/exams`)
    const link = page.getByTestId('exam-table').locator('tbody tr a', { hasText: patientCode })
    await expect.poll(() => link.isVisible(), WAIT).toBe(true)

    // plumblineLight's primary, #1F5C63
    expect(await link.evaluate((a) => getComputedStyle(a).color)).toBe('rgb(31, 92, 99)')
    await context.close()
  })

  it('on a 390 × 844 phone, shows at least six compact rows on one screen, each with the CVP and its band', async () => {
    const height = 844
    const context = await browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 390, height }, isMobile: true, hasTouch: true })
    const page = await signedInPage(context)

    await page.goto(`${server.url}/exams`)
    const rows = page.getByTestId('exam-list').locator('li[data-testid^="exam-row-"]')
    const ours = rows.filter({ hasText: patientCode })
    await expect.poll(() => ours.isVisible(), WAIT).toBe(true)
    expect(await ours.getByTestId('row-cvp').textContent()).toBe('13.7')
    expect(await ours.getByTestId('row-band').textContent()).toBe(`(95% band ${band})`)
    expect(await page.getByTestId('exam-caution').isVisible()).toBe(true)
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    const ribbon = await page.getByTestId('demo-ribbon').boundingBox()
    expect(ribbon?.height).toBeLessThanOrEqual(32)

    // the filters fold behind one button, so the rows begin on the first screen
    const first = (await rows.first().boundingBox())!
    expect(first.y + first.height).toBeLessThanOrEqual(height)
    expect(await page.getByTestId('filter-status-draft').count()).toBe(0)

    // the first row just under the app bar, as far as the page scrolls
    const bar = (await page.locator('.v-app-bar').boundingBox())!
    await page.evaluate((by) => window.scrollBy(0, by), first.y - (bar.y + bar.height))
    const boxes = await Promise.all((await rows.all()).map((row) => row.boundingBox()))
    const onScreen = boxes.filter((box) => box && box.y >= bar.y + bar.height - 1 && box.y + box.height <= height)
    expect(onScreen.length).toBeGreaterThanOrEqual(6)

    await page.getByTestId('exam-filters-toggle').click()
    await page.getByTestId('filter-status-draft').click()
    await expect.poll(() => page.getByTestId('exam-filters-count').textContent(), WAIT).toContain('1')
    await context.close()
  })
})

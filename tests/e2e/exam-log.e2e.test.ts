import { randomUUID } from 'node:crypto'
import type { Browser, BrowserContext } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, launchChromium, signInAs, startDemoServer } from './browser.ts'
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
  await expect.poll(() => page.getByTestId('nav-exams').isVisible(), WAIT).toBe(true)
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
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
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

  it('on a 360 px phone, the log fits the screen and still shows the CVP with its band', async () => {
    const context = await browser.newContext({ viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true })
    const page = await signedInPage(context)

    await page.goto(`${server.url}/exams`)
    const row = page.getByTestId('exam-table').locator('tbody tr', { hasText: patientCode })
    await expect.poll(() => row.isVisible(), WAIT).toBe(true)

    expect(await row.textContent()).toContain(`13.7 (${band})`)
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360)
    await context.close()
  })
})

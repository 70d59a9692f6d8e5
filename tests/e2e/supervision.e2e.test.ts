import { randomUUID } from 'node:crypto'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, launchChromium, NO_SERVICE_WORKER, signInAs, startDemoServer } from './browser.ts'
import { WORKED_EXAMPLE_FINDINGS } from '../../tests/shared/worked-example.ts'

const RESIDENT = 'resident@saltmarsh.test'
const ATTENDING = 'attending@saltmarsh.test'
const ADMIN = 'admin@saltmarsh.test'

// Sign-in hashes a password and the first visit loads lazy chunks: allow more than expect.poll's 1 s.
const WAIT = { timeout: 10_000 }

let server: Awaited<ReturnType<typeof startDemoServer>>
let browser: Browser
let examId: string
const patientCode = `SM-SIGN-${randomUUID().slice(0, 6).toUpperCase()}`

async function apiAs(email: string) {
  const login = await fetch(`${server.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  const { token, user } = (await login.json()) as { token: string; user: { teams: { id: string; name: string }[] } }
  return { headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, team: user.teams[0]! }
}

/** The resident's exam on Ward 7 North, created and submitted through the real API. */
async function submitResidentExam() {
  const { headers, team } = await apiAs(RESIDENT)
  expect(team.name).toContain('Ward 7 North')
  const body = {
    id: randomUUID(),
    patientCode,
    teamId: team.id,
    examinedAt: new Date().toISOString(),
    ...WORKED_EXAMPLE_FINDINGS,
  }
  const created = await fetch(`${server.url}/api/exams`, { method: 'POST', headers, body: JSON.stringify(body) })
  expect(created.status).toBe(201)
  const submitted = await fetch(`${server.url}/api/exams/${body.id}/submit`, { method: 'POST', headers })
  expect(submitted.status).toBe(200)
  return body.id
}

async function signedIn(email: string, navItem: string) {
  const context = await browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 1280, height: 800 } })
  const page = await context.newPage()
  await signInAs(page, server.url, email)
  await expect.poll(() => page.getByTestId(navItem).isVisible(), WAIT).toBe(true)
  return page
}

async function countersignWith(page: Page, password: string) {
  await page.getByTestId('countersign-password').locator('input').fill(password)
  await page.getByTestId('countersign-submit').click()
}

beforeAll(async () => {
  server = await startDemoServer()
  browser = await launchChromium()
  examId = await submitResidentExam()
})

afterAll(async () => {
  await browser?.close()
  await server?.close()
})

describe('countersigning in Chromium', () => {
  it('the attending finds the submitted exam in the queue and countersigns it; a wrong password first costs nothing', async () => {
    const page = await signedIn(ATTENDING, 'nav-signoff-queue')
    await expect.poll(() => page.getByTestId('signoff-count').isVisible(), WAIT).toBe(true)

    await page.getByTestId('nav-signoff-queue').click()
    // the queue is oldest first, so an exam submitted just now waits on the last page
    const row = page.getByTestId('signoff-table').locator('tbody tr', { hasText: patientCode })
    const lastPage = page.getByTestId('signoff-table').getByRole('button', { name: 'Last page' })
    await expect.poll(async () => (await row.isVisible()) || (await lastPage.isEnabled()), WAIT).toBe(true)
    if (!(await row.isVisible())) await lastPage.click()
    await expect.poll(() => row.isVisible(), WAIT).toBe(true)
    expect(await row.textContent()).toContain('Dr Sam Whitcombe')
    await row.click()
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/signoff/${examId}`)
    await page.getByTestId('review-countersign').click()
    await page.getByTestId('meaning-reviewed-agree').locator('input').check()
    await countersignWith(page, 'not-my-password')

    await expect.poll(() => page.getByTestId('countersign-password').textContent(), WAIT).toContain('That password is not right')
    expect(await page.getByTestId('meaning-reviewed-agree').locator('input').isChecked()).toBe(true)
    expect(await page.getByTestId('user-menu').isVisible()).toBe(true)

    await countersignWith(page, DEMO_PASSWORD)

    await expect.poll(() => page.getByTestId('signature-name').textContent(), WAIT).toBe('Dr Tomas Lindqvist')
    // The dialog closes: it may stay in the page as an inactive overlay or be removed, and neither may hold up the check.
    const dialogOpen = () =>
      page.getByTestId('countersign-dialog').evaluateAll((found) => found.some((el) => el.classList.contains('v-overlay--active')))
    await expect.poll(dialogOpen, WAIT).toBe(false)
    await expect.poll(() => page.getByTestId('review-done').isVisible(), WAIT).toBe(true)
    await page.context().close()
  })

  it('the resident then sees the signature manifestation on the exam page', async () => {
    const page = await signedIn(RESIDENT, 'nav-exams')

    await page.goto(`${server.url}/exams/${examId}`)

    await expect.poll(() => page.getByTestId('signature-name').textContent(), WAIT).toBe('Dr Tomas Lindqvist')
    expect(await page.getByTestId('signature-meaning').textContent()).toBe('Reviewed, and agrees with the findings')
    expect(await page.getByTestId('signature-time').textContent()).toMatch(/\d{2}:\d{2} \S+/)
    expect(await page.getByTestId('status-countersigned').isVisible()).toBe(true)
    await page.context().close()
  })

  it('the admin reads the "countersignature requested" message the demo mail catcher received', async () => {
    const page = await signedIn(ADMIN, 'nav-mailbox')
    const requested = page.getByTestId('mail-subject').filter({ hasText: 'Countersignature requested by Dr Sam Whitcombe' })

    await page.getByTestId('nav-mailbox').click()

    // sending is queued after the submission, so the message may land a moment later
    await expect
      .poll(async () => {
        if (await requested.count()) return true
        await page.getByTestId('mailbox-refresh').click()
        return false
      }, WAIT)
      .toBe(true)
    await page.context().close()
  })
})

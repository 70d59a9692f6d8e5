import { randomUUID } from 'node:crypto'
import type { Page } from 'playwright-core'
import { beforeAll, describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, NO_SERVICE_WORKER, signInAs, useDemoBrowser } from './browser.ts'
import { WORKED_EXAMPLE_FINDINGS } from '../../tests/shared/worked-example.ts'

const demo = useDemoBrowser()
const RESIDENT = 'resident@saltmarsh.test'
const ATTENDING = 'attending@saltmarsh.test'
// The demo patient the ward follows through three days of diuresis (server/demo/demo-loop.ts).
const FOLLOWED = 'SM-0301'

// Sign-in hashes a password and the first visit loads lazy chunks: allow more than expect.poll's 1 s.
const WAIT = { timeout: 15_000 }

let examId: string

async function apiAs(email: string) {
  const login = await fetch(`${demo.server.url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  })
  const { token, user } = (await login.json()) as { token: string; user: { teams: { id: string; name: string }[] } }
  return { headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, team: user.teams[0]! }
}

/** Today's exam of the followed patient by the resident (h = 4 cm at 45°), submitted for countersignature. */
async function submitTodaysExam() {
  const { headers, team } = await apiAs(RESIDENT)
  const body = { id: randomUUID(), patientCode: FOLLOWED, teamId: team.id, examinedAt: new Date().toISOString(), ...WORKED_EXAMPLE_FINDINGS }
  expect((await fetch(`${demo.server.url}/api/exams`, { method: 'POST', headers, body: JSON.stringify(body) })).status).toBe(201)
  expect((await fetch(`${demo.server.url}/api/exams/${body.id}/submit`, { method: 'POST', headers })).status).toBe(200)
  return body.id
}

async function phoneAs(email: string) {
  const context = await demo.browser.newContext({ ...NO_SERVICE_WORKER, viewport: { width: 360, height: 740 }, hasTouch: true, isMobile: true })
  const page = await context.newPage()
  await signInAs(page, demo.server.url, email)
  await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe('/')
  return page
}

const overflow = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)

beforeAll(async () => {
  examId = await submitTodaysExam()
})

describe('closing the loop on a phone', () => {
  it("the resident finds the followed patient in the log, follows the timeline and adds a central-line reference to today's exam", async () => {
    const page = await phoneAs(RESIDENT)
    await page.goto(`${demo.server.url}/exams`)
    await page.getByTestId('exam-filters-toggle').click()
    await page.getByTestId('filter-patient').locator('input').fill(FOLLOWED)
    await page.getByTestId('filter-patient').locator('input').press('Enter')
    await page.getByTestId('exam-log-timeline-link').click()

    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/patients/${FOLLOWED}`)
    await expect.poll(() => page.getByTestId('timeline-row-exam').count(), WAIT).toBeGreaterThanOrEqual(8)
    expect(await page.getByTestId('timeline-caution').isVisible()).toBe(true)
    expect(await page.getByTestId('timeline-chart').locator('canvas').isVisible()).toBe(true)
    expect(await page.getByTestId('timeline-chart-caption').textContent()).toMatch(/CVP estimates of \d+ exams over time/)
    expect(await overflow(page)).toBeLessThanOrEqual(0)

    await page.getByTestId('timeline-row-exam').last().locator('a').click()
    await expect.poll(() => new URL(page.url()).pathname, WAIT).toBe(`/exams/${examId}`)
    await page.getByTestId('reference-add').click()
    await page.getByTestId('reference-value').locator('input').fill('12')
    await page.getByTestId('reference-save').click()

    const added = page.getByTestId('reference-list').locator('.v-list-item').filter({ hasText: 'Central line CVP: 12 mmHg (16.3 cmH₂O)' })
    await expect.poll(() => added.count(), WAIT).toBe(1)
    expect(await added.getByTestId('reference-paired').textContent()).toBe('Paired')
    expect(await overflow(page)).toBeLessThanOrEqual(0)

    await page.getByTestId('exam-timeline-link').click()
    await expect.poll(() => page.getByTestId('timeline-row-reference').filter({ hasText: '12 mmHg' }).count(), WAIT).toBe(1)
    await page.context().close()
  })

  it("the attending countersigns after re-examining, with a reading and feedback, and the resident sees both", async () => {
    const attending = await phoneAs(ATTENDING)
    await attending.goto(`${demo.server.url}/signoff/${examId}`)
    await attending.getByTestId('review-countersign').click()
    await attending.getByTestId('meaning-reviewed-re-examined').locator('input').check()
    await attending.getByTestId('countersign-height').locator('input').fill('3')
    await attending.getByTestId('countersign-inclination').locator('input').fill('45')
    await attending.getByTestId('countersign-feedback-read-peak-not-mean').locator('input').check()
    await attending.getByTestId('countersign-feedback-other').locator('input').check()
    await attending.getByTestId('countersign-feedback-text').locator('textarea').first().fill('Let the column settle before reading.')
    await attending.getByTestId('countersign-password').locator('input').fill(DEMO_PASSWORD)
    await attending.getByTestId('countersign-submit').click()
    await expect.poll(() => attending.getByTestId('review-done').isVisible(), WAIT).toBe(true)
    await attending.context().close()

    const resident = await phoneAs(RESIDENT)
    await resident.goto(`${demo.server.url}/exams/${examId}`)

    // h 4 cm against the attending's 3 cm at the same 45°: the same offset, so the estimates differ by 1.0 cmH₂O.
    await expect.poll(() => resident.getByTestId('attending-reading-difference').textContent(), WAIT).toContain('+1.0 cmH₂O (the resident read higher)')
    expect(await resident.getByTestId('attending-reading-values').textContent()).toContain('3.0 cm above the sternal angle at 45°')
    const feedback = await resident.getByTestId('attending-feedback').textContent()
    expect(feedback).toContain('Let the column settle before reading.')
    expect(feedback).toContain('mean level')
    expect(await overflow(resident)).toBeLessThanOrEqual(0)
    await resident.context().close()
  })
})
